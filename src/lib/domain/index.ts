// Dewline's risk engine: pure functions on psychrolib, no I/O. Shared by the server and the client.
export {
  GAS_CONSTANT_WATER_VAPOUR,
  STANDARD_PRESSURE_PA,
  TRIPLE_POINT_C,
  absoluteHumidityFromVapourPressureGPerM3,
  absoluteHumidityGPerM3,
  dewPointC,
  dewPointFromVapourPressureC,
  frostPointC,
  frostPointFromVapourPressureC,
  humidityRatio,
  relativeHumidityPctFromVapourPressure,
  saturationVapourPressureOverIcePa,
  saturationVapourPressurePa,
  surfaceSaturationTemperatureC,
  surfaceSaturationVapourPressurePa,
  vapourPressureFromDewPointPa,
  vapourPressurePa,
} from "./psychrometrics.js";
export {
  BORDERLINE_SURFACE_RH_PCT,
  BUILDING_ELEMENTS,
  CONDENSATION_SURFACE_RH_PCT,
  CORNER_TEMPERATURE_FACTOR,
  CRITICAL_TEMPERATURE_FACTOR,
  ELEMENT_IDS,
  MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K,
  MOULD_SURFACE_RH_PCT,
  RSI_GLAZING_M2K_PER_W,
  RSI_OPAQUE_M2K_PER_W,
  SURFACE_STATES,
  estimateSurfaceTemperatureC,
  getBuildingElement,
  isElementId,
  minimumTemperatureFactor,
  surfaceRelativeHumidityPct,
  surfaceState,
  temperatureFactor,
  temperatureFactorFromUValue,
} from "./surface.js";
export type {
  BuildingElement,
  ElementId,
  MinimumTemperatureFactor,
  MinimumTemperatureFactorInput,
  SurfaceState,
} from "./surface.js";
export {
  DECLINE_AFTER_24H_PER_HOUR,
  DECLINE_FIRST_6H_PER_HOUR,
  MATERIAL_CLASSES,
  MATERIAL_SENSITIVITIES,
  MAX_MOULD_INDEX,
  createMouldIndexState,
  criticalRelativeHumidityPct,
  isFavourableForGrowth,
  materialClass,
  maximumMouldIndex,
  mouldDecline,
  mouldGrowthRatePerDay,
  stepMouldIndex,
} from "./mould-index.js";
export type { MaterialClass, MaterialSensitivity, MouldIndexState } from "./mould-index.js";
export {
  ASSUMED_OUTDOOR_RH_PCT,
  HIGH_MOISTURE_LOAD_CLASS,
  moistureLoadBoundaryGPerM3,
  moistureLoadClass,
} from "./moisture-load.js";
export { evaluatePoint } from "./point.js";
export type { PointInput, PointReason, PointReasonId, PointResult, SurfaceResult, SurfaceSource } from "./point.js";
export { POINT_REASON_IDS, reasonInEnglish } from "./point.js";
export {
  MAX_INTEGRATION_GAP_HOURS,
  MIN_WINDOW_COVER_DAYS,
  ROLLING_WINDOW_DAYS,
  evaluateSeries,
  mouldIndexTrajectory,
  worstRollingMean,
} from "./series.js";
export type { MouldIndexPoint, SeriesGap, SeriesInput, SeriesReading, SeriesResult } from "./series.js";
export { HIGH_AIR_RH_PCT, MIN_OBSERVED_HOURS, diagnose } from "./diagnosis.js";
export type { Diagnosis, DiagnosisFacts, DiagnosisKind } from "./diagnosis.js";
export { elementsForReport, glazingElement, wallElement } from "./home-elements.js";
export type { GlazingKind, WallKind } from "./home-elements.js";
export {
  CASE_STATUSES,
  CASE_TRANSITIONS,
  MAIN_PATH,
  MANUAL_MOVES_NEED_A_REASON,
  canTransition,
  movesValidForAll,
  stepsForward,
  transitionNeedsReason,
} from "./case-workflow.js";
export type { CaseStatus } from "./case-workflow.js";
// working-days.ts and deadlines.ts are deliberately not re-exported here: they load the bank-holiday
// data package (about 0.8 MB, not tree-shaken), which the browser does not need. Import them directly.
export {
  BANDS,
  CATEGORY_1_MIN_SCORE,
  CLASS_WEIGHTS,
  HARM_CLASSES,
  LIKELIHOOD_POINTS,
  SPREAD_POINTS,
  bandFor,
  categoryFor,
  hhsrsScore,
  validateAssessment,
} from "./hhsrs.js";
export type { AssessmentProblem, Band, BandRange, HarmClass, HhsrsAssessment, HhsrsResult } from "./hhsrs.js";
export {
  MAX_ORDINARY_TRIAGE_SCORE,
  MAX_TRIAGE_SCORE,
  TRIAGE_AREAS,
  TRIAGE_FACTORS,
  TRIAGE_VULNERABILITIES,
  TRIAGE_WEIGHTS,
  triagePriority,
  hoursUntilDeadlinePartChanges,
  isOverdueEmergency,
} from "./triage-priority.js";
export type {
  TriageArea,
  TriageFactor,
  TriageInput,
  TriagePart,
  TriagePriority,
  TriageVulnerability,
} from "./triage-priority.js";
export {
  ADVICE_CAUTIONS,
  ADVICE_IDS,
  ADVICE_SOURCES,
  HEATING_COST_ANSWERS,
  MAX_ADVICE_ITEMS,
  NO_OVEN_FOR_WARMTH,
  adviseForHome,
  type AdviceId,
  type AdviceItem,
  type CostBand,
  type HeatingCostAnswer,
  type HomeAdvice,
  type HomeAdviceFacts,
} from "./home-advice.js";
