import type { DataSource, EntityManager } from "typeorm";
import type {
  InvitationProgress,
  TenancyImportPreview,
  TenancyImportSummary,
  TenancyMapping,
  TenancyRowReport,
} from "../../../src/lib/contracts/tenancy-import.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError, ValidationError } from "../../lib/errors.js";
import { readTableHead, tableRowChunks } from "../../lib/table-file.js";
import type { BatchProgress, InvitationBatchService, QueuedInvitation } from "../auth/invitation-batch.service.js";
import type { PropertyService } from "../properties/property.service.js";
import type { ImportedTenancy, TenancyService } from "../tenancies/tenancy.service.js";
import type { ImportedContact, UserService } from "../users/user.service.js";
import { TenancyImport } from "./tenancy-import.entity.js";
import { detectMapping, missingFields, readTenancyRow, type TenancyRow } from "./tenancy-rows.js";

/** More rows than any one landlord's tenancy file should need in one go (split it otherwise). */
export const MAX_TENANCY_ROWS = 50_000;

const fileError = (message: string) => new ValidationError(`file: ${message}`, [{ field: "file", message }]);

const unique = <T>(xs: readonly T[]) => [...new Set(xs)];

export const INVITATION_QUEUED = "Invitation queued: it goes out with the next batches.";
const ENDED = "The tenancy has ended: no invitation.";

/** What one import's transaction knows, read once and kept up to date row by row. */
interface ImportState {
  actor: Actor;
  today: string;
  homes: Map<string, number>;
  existing: Map<string, ImportedTenancy & { id: number; tenantUserId: number }>;
  contacts: Map<string, ImportedContact>;
  /** Addresses invited before this import (queued or sent). */
  queuedBefore: Set<string>;
  toInvite: QueuedInvitation[];
  /** New tenancies, inserted together once every row is read. */
  newTenancies: (ImportedTenancy & { organisationId: number; reference: string; tenantUserId: number })[];
}

/**
 * A landlord's tenancy file (CSV or .xlsx) brought in by an admin: tenant accounts without passwords
 * and their tenancies, upserted by the landlord's tenancy reference, in one transaction per file, with
 * each row's outcome; the invitations are queued as a batch (InvitationBatchService), never sent at once.
 */
export class TenancyImportService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly users: UserService,
    private readonly invitations: InvitationBatchService,
    private readonly clock: Clock,
  ) {}

  /** The file's header and its non-blank rows, each with its line (CSV) or row (workbook) number. */
  private async table(path: string) {
    const head = await readTableHead(path, 0);
    const rows: { cells: string[]; row: number }[] = [];
    let count = 0;
    for await (const chunk of tableRowChunks(path, head)) {
      count += chunk.length;
      // Past the limit only the count is kept, for the message.
      if (count <= MAX_TENANCY_ROWS) for (const r of chunk) rows.push({ cells: r.cells.map((c) => c.trim()), row: r.line });
    }
    if (count > MAX_TENANCY_ROWS) {
      throw fileError(`The file has ${count} rows; import at most ${MAX_TENANCY_ROWS} at a time.`);
    }
    return { kind: head.format, headers: head.headers, rows };
  }

  /** How the file would be read: its columns, the proposed mapping and its first rows. */
  async preview(path: string): Promise<TenancyImportPreview> {
    const { kind, headers, rows } = await this.table(path);
    const mapping = detectMapping(headers);
    return {
      fileKind: kind,
      headers,
      mapping,
      missing: missingFields(mapping),
      sampleRows: rows.slice(0, 5).map((r) => r.cells),
      rows: rows.length,
    };
  }

  async import(
    actor: Actor,
    input: { path: string; fileName: string; mapping?: TenancyMapping },
  ): Promise<TenancyImportSummary & { report: TenancyRowReport[] }> {
    const { headers, rows } = await this.table(input.path);
    const mapping = input.mapping ?? detectMapping(headers);
    const outside = Object.entries(mapping).filter(([, i]) => i !== null && i >= headers.length);
    if (outside.length) {
      throw new ValidationError(
        "mapping: a column is beyond the file's last column.",
        outside.map(([f]) => ({ field: `mapping.${f}`, message: "The file has no such column." })),
      );
    }
    const missing = missingFields(mapping);
    if (missing.length) {
      throw new ValidationError(`mapping: choose the file's column for the ${missing.join(", ")}.`, [
        { field: "mapping", message: `Choose the column for the ${missing.join(", ")}.` },
      ]);
    }

    const report: TenancyRowReport[] = [];
    const valid: TenancyRow[] = [];
    const firstRowOf = new Map<string, number>();
    for (const { cells, row } of rows) {
      const read = readTenancyRow(cells, mapping, row);
      if (!read.ok) {
        report.push({ row, reference: read.reference, outcome: "rejected", changes: [], reasons: read.reasons });
        continue;
      }
      const first = firstRowOf.get(read.value.reference);
      if (first !== undefined) {
        report.push({
          row,
          reference: read.value.reference,
          outcome: "rejected",
          changes: [],
          reasons: [`The tenancy reference ${read.value.reference} is also on row ${first}; only that row was used.`],
        });
        continue;
      }
      firstRowOf.set(read.value.reference, row);
      valid.push(read.value);
    }

    const saved = await this.dataSource.transaction(async (m) => {
      const organisationId = actor.organisationId;
      const emails = unique(valid.map((v) => v.email));
      const state: ImportState = {
        actor,
        today: this.tenancies.today(),
        homes: await this.properties.idsByUprn(organisationId, unique(valid.map((v) => v.uprn)), m),
        existing: await this.tenancies.byReferences(
          m,
          organisationId,
          valid.map((v) => v.reference),
        ),
        contacts: await this.users.contactsByEmail(m, emails),
        queuedBefore: await this.invitations.alreadyQueued(m, organisationId, emails),
        toInvite: [],
        newTenancies: [],
      };
      for (const v of valid) report.push(await this.applyRow(m, state, v));
      await this.tenancies.createImported(m, state.newTenancies);
      report.sort((a, b) => a.row - b.row);
      const batchId = await this.invitations.queue(m, actor, state.toInvite);
      const count = (o: TenancyRowReport["outcome"]) => report.filter((r) => r.outcome === o).length;
      return m.getRepository(TenancyImport).save({
        organisationId,
        createdById: actor.id,
        fileName: input.fileName.slice(0, 255),
        createdAt: this.clock.now(),
        rowsRead: rows.length,
        createdCount: count("created"),
        updatedCount: count("updated"),
        unchangedCount: count("unchanged"),
        rejectedCount: count("rejected"),
        invitationBatchId: batchId,
        report: JSON.stringify(report),
      });
    });
    const [summary] = await this.summaries(actor, [saved]);
    return { ...summary!, report };
  }

  /** One valid row against the database: the account, the tenancy and the invitation, or the reasons it cannot be. */
  private async applyRow(m: EntityManager, s: ImportState, v: TenancyRow): Promise<TenancyRowReport> {
    const organisationId = s.actor.organisationId;
    const rejected = (reasons: string[]): TenancyRowReport => ({
      row: v.row,
      reference: v.reference,
      outcome: "rejected",
      changes: [],
      reasons,
    });
    const home = s.homes.get(v.uprn);
    if (home === undefined) return rejected([`None of your homes has the UPRN ${v.uprn}: add the home first.`]);
    const current = s.existing.get(v.reference);
    const contact = s.contacts.get(v.email);
    const ours = contact && contact.organisationId === organisationId ? contact : undefined;
    const ended = v.endDate !== null && v.endDate < s.today;
    const notes = [...v.notes];

    if (current) {
      if (!ours || ours.id !== current.tenantUserId) {
        return rejected([
          "This tenancy reference is on record with another tenant's e-mail address. A new tenant needs a new tenancy reference; to correct an address, change it under People.",
        ]);
      }
      if (current.propertyId !== home) {
        return rejected([
          "This tenancy is on record at another home, and a tenancy cannot move home: end it, and add the new home's tenancy with its own reference.",
        ]);
      }
    }
    if (ours && ours.role !== "tenant") {
      return rejected(["This e-mail address belongs to a staff account at your organisation; a tenant needs their own address."]);
    }
    if (ours && ours.status === "disabled") {
      return rejected(["This tenant's account is disabled: enable it under People, then import the row again."]);
    }

    if (contact && !ours) {
      // Another landlord's account uses the address. The row reads exactly as a new tenant's would; the
      // address's owner is e-mailed that it is in use (with the batch), and nothing else is stored.
      if (ended) notes.push(ENDED);
      else if (!s.queuedBefore.has(v.email)) {
        if (!s.toInvite.some((i) => i.email === v.email)) s.toInvite.push({ userId: null, email: v.email });
        notes.push(INVITATION_QUEUED);
      }
      const outcome = s.queuedBefore.has(v.email) ? "unchanged" : "created";
      return { row: v.row, reference: v.reference, outcome, changes: [], reasons: notes };
    }

    const changes: string[] = [];
    let account: ImportedContact;
    if (!ours) {
      const person = await this.users.createImportedTenant(m, {
        organisationId,
        email: v.email,
        name: v.name,
        phone: v.phone,
        preferredLanguage: v.language,
      });
      account = { ...person, status: "invited", phone: v.phone, preferredLanguage: v.language };
      s.contacts.set(v.email, account);
    } else {
      account = ours;
      if (account.status === "cancelled") {
        await this.users.reviveCancelled(m, { organisationId, email: v.email, name: v.name, role: "tenant" });
        account.status = "invited";
        changes.push("invitation renewed");
      }
      const patch: { name?: string; phone?: string; preferredLanguage?: string } = {};
      if (account.name !== v.name) patch.name = v.name;
      // An empty cell is "not known", never a reason to forget what the account holds.
      if (v.phone !== null && account.phone !== v.phone) patch.phone = v.phone;
      if (v.language !== null && account.preferredLanguage !== v.language) patch.preferredLanguage = v.language;
      await this.users.updateContact(m, account.id, patch);
      Object.assign(account, patch);
      if (patch.name) changes.push("name");
      if (patch.phone) changes.push("phone");
      if (patch.preferredLanguage) changes.push("language");
    }

    const fields = {
      propertyId: home,
      startDate: v.startDate,
      endDate: v.endDate,
      accessNeeds: v.accessNeeds,
      householdVulnerability: v.vulnerability,
    };
    if (!current) {
      s.newTenancies.push({ ...fields, organisationId, reference: v.reference, tenantUserId: account.id });
    } else {
      const patch: Partial<typeof fields> = {};
      const labels = {
        startDate: "start date",
        endDate: "end date",
        accessNeeds: "access needs",
        householdVulnerability: "household vulnerability",
      } as const;
      for (const key of Object.keys(labels) as (keyof typeof labels)[]) {
        if ((current[key] ?? null) !== fields[key]) {
          Object.assign(patch, { [key]: fields[key] });
          // Without consent in the file, what was held is removed.
          changes.push(fields[key] === null && key !== "endDate" ? `${labels[key]} removed` : labels[key]);
        }
      }
      await this.tenancies.updateImported(m, current.id, patch);
    }

    if (ended) notes.push(ENDED);
    else if (account.status === "invited" && !s.queuedBefore.has(v.email) && !s.toInvite.some((i) => i.email === v.email)) {
      s.toInvite.push({ userId: account.id, email: v.email });
      notes.push(INVITATION_QUEUED);
    }
    const outcome = !current ? "created" : changes.length ? "updated" : "unchanged";
    return { row: v.row, reference: v.reference, outcome, changes, reasons: notes };
  }

  /** The landlord's latest imports, newest first, with their invitations' progress. */
  async list(actor: Actor): Promise<TenancyImportSummary[]> {
    const rows = await this.dataSource.getRepository(TenancyImport).find({
      where: { organisationId: actor.organisationId },
      order: { id: "DESC" },
      take: 20,
    });
    return this.summaries(actor, rows);
  }

  /** One import's per-row report (another landlord's is not found). */
  async report(actor: Actor, id: number): Promise<{ fileName: string; rows: TenancyRowReport[] }> {
    const row = await this.dataSource.getRepository(TenancyImport).findOneBy({ id, organisationId: actor.organisationId });
    if (!row) throw new NotFoundError("No such tenancy import.");
    return { fileName: row.fileName, rows: JSON.parse(row.report) as TenancyRowReport[] };
  }

  /** The batch an import queued, if it is the landlord's. */
  async batchOf(actor: Actor, id: number): Promise<number> {
    const row = await this.dataSource.getRepository(TenancyImport).findOneBy({ id, organisationId: actor.organisationId });
    if (!row) throw new NotFoundError("No such tenancy import.");
    if (row.invitationBatchId === null) throw new NotFoundError("This import queued no invitations.");
    return row.invitationBatchId;
  }

  private async summaries(actor: Actor, rows: TenancyImport[]): Promise<TenancyImportSummary[]> {
    const batchIds = rows.map((r) => r.invitationBatchId).filter((b): b is number => b !== null);
    const progress = await this.invitations.progress(actor.organisationId, batchIds);
    const names = await this.users.people(unique(rows.map((r) => r.createdById)));
    const toDto = (p: BatchProgress | undefined): InvitationProgress | null =>
      p ? { ...p, nextReleaseAt: p.nextReleaseAt?.toISOString() ?? null } : null;
    return rows.map((r) => ({
      id: r.id,
      fileName: r.fileName,
      createdAt: r.createdAt.toISOString(),
      createdBy: names.get(r.createdById)?.name ?? "",
      rows: r.rowsRead,
      created: r.createdCount,
      updated: r.updatedCount,
      unchanged: r.unchangedCount,
      rejected: r.rejectedCount,
      invitations: r.invitationBatchId === null ? null : toDto(progress.get(r.invitationBatchId)),
    }));
  }
}
