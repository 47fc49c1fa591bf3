// Every migration, in order. A newly generated migration is added here by hand (see DEVELOPERS.md),
// so the app, the CLI and the tests load exactly the same list without file globbing.
import { Foundation1796180785107 } from "./migrations/1796180785107-Foundation.js";
import { CasesPhotosReadings1796181981716 } from "./migrations/1796181981716-CasesPhotosReadings.js";
import { CaseAssigneeAndHazardClass1796184941727 } from "./migrations/1796184941727-CaseAssigneeAndHazardClass.js";
import { HhsrsAssessments1796185629417 } from "./migrations/1796185629417-HhsrsAssessments.js";
import { InspectionsAndSummaries1796185801114 } from "./migrations/1796185801114-InspectionsAndSummaries.js";
import { DeadlinePolicies1796186425570 } from "./migrations/1796186425570-DeadlinePolicies.js";
import { TriageFigures1796188877489 } from "./migrations/1796188877489-TriageFigures.js";
import { DeadlineDigests1796189021283 } from "./migrations/1796189021283-DeadlineDigests.js";
import { WorkOrders1796191882151 } from "./migrations/1796191882151-WorkOrders.js";
import { QueueFilterIndex1796192104532 } from "./migrations/1796192104532-QueueFilterIndex.js";
import { WorkCompletionDate1796400714992 } from "./migrations/1796400714992-WorkCompletionDate.js";
import { CaseReadMarks1796400825803 } from "./migrations/1796400825803-CaseReadMarks.js";
import { HomesSortKeyAndVentilation1796400866674 } from "./migrations/1796400866674-HomesSortKeyAndVentilation.js";
import { UserAuditEntries1796401046829 } from "./migrations/1796401046829-UserAuditEntries.js";
import { PolicyEmergencyPhone1796401387060 } from "./migrations/1796401387060-PolicyEmergencyPhone.js";
import { OutboxRelay1796412321162 } from "./migrations/1796412321162-OutboxRelay.js";
import { RoomEvaluations1796412626434 } from "./migrations/1796412626434-RoomEvaluations.js";
import { SignInWaitsAndSessionStamps1796412951142 } from "./migrations/1796412951142-SignInWaitsAndSessionStamps.js";
import { PhotoUploadUsage1796412986381 } from "./migrations/1796412986381-PhotoUploadUsage.js";
import { TenancyImport1796424829707 } from "./migrations/1796424829707-TenancyImport.js";
import { ApiKeys1796424839722 } from "./migrations/1796424839722-ApiKeys.js";
import { StockRegisterFields1796424932669 } from "./migrations/1796424932669-StockRegisterFields.js";
import { Webhooks1796425164411 } from "./migrations/1796425164411-Webhooks.js";
import { IntegrationAdminActions1796434337752 } from "./migrations/1796434337752-IntegrationAdminActions.js";
import { ExportSortIndexes1796436010598 } from "./migrations/1796436010598-ExportSortIndexes.js";
import { CaseMilestones1796443743318 } from "./migrations/1796443743318-CaseMilestones.js";
import { Complaints1796444351206 } from "./migrations/1796444351206-Complaints.js";
import { BoardReports1796445784777 } from "./migrations/1796445784777-BoardReports.js";
import { MissedDeadlineReasons1796448909533 } from "./migrations/1796448909533-MissedDeadlineReasons.js";
import { Sensors1796460000000 } from "./migrations/1796460000000-Sensors.js";
import { SensorHealth1796460054896 } from "./migrations/1796460054896-SensorHealth.js";
import { SensorWatch1796461027791 } from "./migrations/1796461027791-SensorWatch.js";
import { WeatherLocations1796461205317 } from "./migrations/1796461205317-WeatherLocations.js";
import { IdempotencyKeys1796462000000 } from "./migrations/1796462000000-IdempotencyKeys.js";
import { JobLeasesAndRateLimits1796462100000 } from "./migrations/1796462100000-JobLeasesAndRateLimits.js";
import { SensorReadingsByMonth1796462200000 } from "./migrations/1796462200000-SensorReadingsByMonth.js";
import { CaseStatusCounts1796462300000 } from "./migrations/1796462300000-CaseStatusCounts.js";
import { QueueCoveringIndexes1796462400000 } from "./migrations/1796462400000-QueueCoveringIndexes.js";
import { HeatingSupportPolicy1796462600000 } from "./migrations/1796462600000-HeatingSupportPolicy.js";
import { TextMessages1796462700000 } from "./migrations/1796462700000-TextMessages.js";
import { HomeSearchPieces1796463000000 } from "./migrations/1796463000000-HomeSearchPieces.js";
import { CasePriorityCounts1796463500000 } from "./migrations/1796463500000-CasePriorityCounts.js";

export const migrations = [
  Foundation1796180785107,
  CasesPhotosReadings1796181981716,
  CaseAssigneeAndHazardClass1796184941727,
  HhsrsAssessments1796185629417,
  InspectionsAndSummaries1796185801114,
  DeadlinePolicies1796186425570,
  TriageFigures1796188877489,
  DeadlineDigests1796189021283,
  WorkOrders1796191882151,
  QueueFilterIndex1796192104532,
  WorkCompletionDate1796400714992,
  CaseReadMarks1796400825803,
  HomesSortKeyAndVentilation1796400866674,
  UserAuditEntries1796401046829,
  PolicyEmergencyPhone1796401387060,
  OutboxRelay1796412321162,
  RoomEvaluations1796412626434,
  SignInWaitsAndSessionStamps1796412951142,
  PhotoUploadUsage1796412986381,
  TenancyImport1796424829707,
  ApiKeys1796424839722,
  StockRegisterFields1796424932669,
  Webhooks1796425164411,
  IntegrationAdminActions1796434337752,
  ExportSortIndexes1796436010598,
  CaseMilestones1796443743318,
  Complaints1796444351206,
  BoardReports1796445784777,
  MissedDeadlineReasons1796448909533,
  Sensors1796460000000,
  SensorHealth1796460054896,
  SensorWatch1796461027791,
  WeatherLocations1796461205317,
  IdempotencyKeys1796462000000,
  JobLeasesAndRateLimits1796462100000,
  SensorReadingsByMonth1796462200000,
  CaseStatusCounts1796462300000,
  QueueCoveringIndexes1796462400000,
  HeatingSupportPolicy1796462600000,
  TextMessages1796462700000,
  HomeSearchPieces1796463000000,
  CasePriorityCounts1796463500000,
];
