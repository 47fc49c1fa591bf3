import { promisify } from "node:util";
import { gunzip, gzip } from "node:zlib";
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
import { TENANCY_IMPORT_MAX_ROWS } from "../../../src/lib/contracts/tenancy-import.js";
import { readTableHead, tableRowChunks } from "../../lib/table-file.js";
import type { BatchProgress, InvitationBatchService } from "../auth/invitation-batch.service.js";
import type { PropertyService } from "../properties/property.service.js";
import type { ImportedTenancy, TenancyService } from "../tenancies/tenancy.service.js";
import type { ImportedContact, UserService } from "../users/user.service.js";
import { TenancyImport } from "./tenancy-import.entity.js";
import { detectMapping, missingFields, readTenancyRow, type TenancyRow } from "./tenancy-rows.js";
import { referenceKey } from "../../../src/lib/domain/tenancy-reference.js";

/**
 * The most rows one file may hold: every row's outcome is kept for the report (and returned with the
 * import), so a larger file is split. 100 000 tenancies import in about 30 s (npm run bench:tenancy).
 */
export const MAX_TENANCY_ROWS = TENANCY_IMPORT_MAX_ROWS;

/** Valid rows decided and stored together: one set of reads and one set of writes for each batch. */
export const BATCH_ROWS = 5_000;

const gzipAsync = promisify(gzip);
const gunzipAsync = promisify(gunzip);

const fileError = (message: string) => new ValidationError(`file: ${message}`, [{ field: "file", message }]);
const fmt = (n: number) => n.toLocaleString("en-GB").replace(/,/g, " ");
const tooManyRows = () =>
  fileError(
    `The file has more than ${fmt(MAX_TENANCY_ROWS)} rows: split it into files of at most ${fmt(MAX_TENANCY_ROWS)} rows.`,
  );

const unique = <T>(xs: readonly T[]) => [...new Set(xs)];

export const INVITATION_QUEUED = "Invitation queued: it goes out with the next batches.";
const ENDED = "The tenancy has ended: no invitation.";

/** The rows worth a look: added, updated, not imported, or unchanged with a note. */
export function notableRows(report: readonly TenancyRowReport[]): TenancyRowReport[] {
  return report.filter((r) => r.outcome !== "unchanged" || r.reasons.length > 0);
}

/** Every column of an import but its report (which may be megabytes). */
const SUMMARY_COLUMNS = {
  id: true,
  organisationId: true,
  createdById: true,
  fileName: true,
  createdAt: true,
  rowsRead: true,
  createdCount: true,
  updatedCount: true,
  unchangedCount: true,
  rejectedCount: true,
  invitationBatchId: true,
} as const;

const GZIP = "gzip:";

/**
 * The report as stored: its JSON gzip-compressed, in base64 behind "gzip:". A report of 100 000 rows
 * is some 13 MB of JSON, near MariaDB's default 16 MB max_allowed_packet; compressed, well under 1 MB.
 */
async function encodeReport(report: readonly TenancyRowReport[]): Promise<string> {
  return GZIP + (await gzipAsync(JSON.stringify(report))).toString("base64");
}

/** The stored report (imports stored before compression hold the plain JSON). */
async function decodeReport(stored: string): Promise<TenancyRowReport[]> {
  const json = stored.startsWith(GZIP)
    ? (await gunzipAsync(Buffer.from(stored.slice(GZIP.length), "base64"))).toString("utf8")
    : stored;
  return JSON.parse(json) as TenancyRowReport[];
}

/** What one import knows across its batches. */
interface ImportRun {
  actor: Actor;
  today: string;
  report: TenancyRowReport[];
  /** Each reference's first row (by referenceKey), to refuse a repeat. */
  firstRowOf: Map<string, number>;
  /** Addresses this import has queued an invitation for. */
  invited: Set<string>;
  batchId: number | null;
}

/** What one batch of valid rows reads before deciding, and what it decides to write. */
interface BatchState {
  homes: Map<string, number>;
  existing: Map<string, ImportedTenancy & { id: number; tenantUserId: number }>;
  /** Accounts by address; a new one has id 0 until it is inserted. */
  contacts: Map<string, ImportedContact>;
  /** Addresses invited before this import (queued or sent). */
  queuedBefore: Set<string>;
  newAccounts: ImportedContact[];
  changedAccounts: Map<number, { account: ImportedContact; revive: boolean }>;
  newTenancies: (ImportedTenancy & { reference: string; account: ImportedContact })[];
  changedTenancies: (ImportedTenancy & { id: number })[];
  invitations: { account: ImportedContact | null; email: string }[];
}

/**
 * A landlord's tenancy file (CSV or .xlsx) brought in by an admin: tenant accounts without passwords
 * and their tenancies, upserted by the landlord's tenancy reference, in one transaction per file, with
 * each row's outcome; the invitations are queued as a batch (InvitationBatchService), never sent at once.
 * Rows are consumed a chunk at a time and stored BATCH_ROWS valid rows at a time (`storeBatch`): set-based
 * reads and writes, each row decided in memory by the same rules, in file order.
 */
export class TenancyImportService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly users: UserService,
    private readonly invitations: InvitationBatchService,
    private readonly clock: Clock,
    private readonly options: { batchRows: number } = { batchRows: BATCH_ROWS },
  ) {}

  /** How the file would be read: its columns, the proposed mapping, its first rows and how many there are. */
  async preview(path: string): Promise<TenancyImportPreview> {
    const head = await readTableHead(path, 0);
    const mapping = detectMapping(head.headers);
    let count = 0;
    for await (const chunk of tableRowChunks(path, head)) count += chunk.length;
    return {
      fileKind: head.format,
      headers: head.headers,
      mapping,
      missing: missingFields(mapping),
      sampleRows: head.sampleRows.slice(0, 5).map((cells) => cells.map((c) => c.trim())),
      rows: count,
    };
  }

  async import(
    actor: Actor,
    input: { path: string; fileName: string; mapping?: TenancyMapping },
  ): Promise<TenancyImportSummary & { report: TenancyRowReport[] }> {
    const head = await readTableHead(input.path, 0);
    const headers = head.headers;
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

    // The file is read as the rows are stored, never whole: the reader leaves blank rows out.
    const chunks = tableRowChunks(input.path, head);

    const saved = await this.dataSource.transaction(async (m) => {
      const organisationId = actor.organisationId;
      const run: ImportRun = {
        actor,
        today: this.tenancies.today(),
        report: [],
        firstRowOf: new Map(),
        invited: new Set(),
        batchId: null,
      };
      let rowsRead = 0;
      let valid: TenancyRow[] = [];
      for await (const chunk of chunks) {
        for (const { line, cells } of chunk) {
          if (++rowsRead > MAX_TENANCY_ROWS) throw tooManyRows();
          const read = readTenancyRow(
            cells.map((c) => c.trim()),
            mapping,
            line,
          );
          if (!read.ok) {
            run.report.push({ row: line, reference: read.reference, outcome: "rejected", changes: [], reasons: read.reasons });
            continue;
          }
          const first = run.firstRowOf.get(referenceKey(read.value.reference));
          if (first !== undefined) {
            run.report.push({
              row: line,
              reference: read.value.reference,
              outcome: "rejected",
              changes: [],
              reasons: [`The tenancy reference ${read.value.reference} is also on row ${first}; only that row was used.`],
            });
            continue;
          }
          run.firstRowOf.set(referenceKey(read.value.reference), line);
          valid.push(read.value);
          if (valid.length >= this.options.batchRows) {
            await this.storeBatch(m, run, valid);
            valid = [];
          }
        }
      }
      if (valid.length) await this.storeBatch(m, run, valid);

      const report = run.report.sort((a, b) => a.row - b.row);
      const counts = { created: 0, updated: 0, unchanged: 0, rejected: 0 };
      for (const r of report) counts[r.outcome]++;
      return {
        report,
        record: await m.getRepository(TenancyImport).save({
          organisationId,
          createdById: actor.id,
          fileName: input.fileName.slice(0, 255),
          createdAt: this.clock.now(),
          rowsRead,
          createdCount: counts.created,
          updatedCount: counts.updated,
          unchangedCount: counts.unchanged,
          rejectedCount: counts.rejected,
          invitationBatchId: run.batchId,
          report: await encodeReport(report),
        }),
      };
    });
    const [summary] = await this.summaries(actor, [saved.record]);
    return { ...summary!, report: saved.report };
  }

  /**
   * One batch of valid rows: what is held for them read in a few statements, each row decided in
   * memory in file order, then the new and changed accounts, tenancies and invitations written in a
   * few statements (in the import's transaction). A later batch reads what an earlier one wrote.
   */
  private async storeBatch(m: EntityManager, run: ImportRun, rows: readonly TenancyRow[]): Promise<void> {
    const organisationId = run.actor.organisationId;
    const emails = unique(rows.map((v) => v.email));
    const queued = await this.invitations.alreadyQueued(m, organisationId, emails);
    const s: BatchState = {
      homes: await this.properties.idsByUprn(organisationId, unique(rows.map((v) => v.uprn)), m),
      existing: await this.tenancies.byReferences(
        m,
        organisationId,
        rows.map((v) => v.reference),
      ),
      contacts: await this.users.contactsByEmail(m, emails),
      queuedBefore: new Set([...queued].filter((e) => !run.invited.has(e))),
      newAccounts: [],
      changedAccounts: new Map(),
      newTenancies: [],
      changedTenancies: [],
      invitations: [],
    };
    for (const v of rows) run.report.push(this.decideRow(run, s, v));

    const ids = await this.users.createImportedTenants(m, organisationId, s.newAccounts);
    const idOf = (a: ImportedContact) => {
      const id = a.id || ids.get(a.email);
      if (!id) throw new Error(`tenancy import: no account id read back for a new account`);
      return id;
    };
    await this.users.updateImportedContacts(
      m,
      organisationId,
      [...s.changedAccounts.values()].map(({ account: a, revive }) => ({
        id: a.id,
        name: a.name,
        phone: a.phone,
        preferredLanguage: a.preferredLanguage,
        revive,
      })),
    );
    await this.tenancies.createImported(
      m,
      organisationId,
      s.newTenancies.map(({ account, ...t }) => ({ ...t, tenantUserId: idOf(account) })),
    );
    await this.tenancies.updateImported(m, organisationId, s.changedTenancies);
    if (s.invitations.length) {
      run.batchId ??= await this.invitations.openBatch(m, run.actor);
      await this.invitations.enqueue(
        m,
        run.batchId,
        organisationId,
        s.invitations.map((i) => ({ userId: i.account ? idOf(i.account) : null, email: i.email })),
      );
    }
  }

  /** One valid row against what is held (and what earlier rows decided): its outcome, and what to write. */
  private decideRow(run: ImportRun, s: BatchState, v: TenancyRow): TenancyRowReport {
    const organisationId = run.actor.organisationId;
    const rejected = (reasons: string[]): TenancyRowReport => ({
      row: v.row,
      reference: v.reference,
      outcome: "rejected",
      changes: [],
      reasons,
    });
    const home = s.homes.get(v.uprn);
    if (home === undefined) return rejected([`None of your homes has the UPRN ${v.uprn}: add the home first.`]);
    const current = s.existing.get(referenceKey(v.reference));
    const contact = s.contacts.get(v.email);
    const ours = contact && contact.organisationId === organisationId ? contact : undefined;
    const ended = v.endDate !== null && v.endDate < run.today;
    const notes = [...v.notes];
    const invite = (account: ImportedContact | null) => {
      run.invited.add(v.email);
      s.invitations.push({ account, email: v.email });
      notes.push(INVITATION_QUEUED);
    };

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
        if (!run.invited.has(v.email)) invite(null);
        else notes.push(INVITATION_QUEUED);
      }
      const outcome = s.queuedBefore.has(v.email) ? "unchanged" : "created";
      return { row: v.row, reference: v.reference, outcome, changes: [], reasons: notes };
    }

    const changes: string[] = [];
    let account: ImportedContact;
    if (!ours) {
      account = {
        id: 0,
        organisationId,
        email: v.email,
        name: v.name,
        role: "tenant",
        status: "invited",
        phone: v.phone,
        preferredLanguage: v.language,
      };
      s.newAccounts.push(account);
      s.contacts.set(v.email, account);
    } else {
      account = ours;
      let revive = false;
      if (account.status === "cancelled") {
        revive = true;
        account.status = "invited";
        changes.push("invitation renewed");
      }
      const patch: { name?: string; phone?: string; preferredLanguage?: string } = {};
      if (account.name !== v.name) patch.name = v.name;
      // An empty cell is "not known", never a reason to forget what the account holds.
      if (v.phone !== null && account.phone !== v.phone) patch.phone = v.phone;
      if (v.language !== null && account.preferredLanguage !== v.language) patch.preferredLanguage = v.language;
      Object.assign(account, patch);
      if (patch.name) changes.push("name");
      if (patch.phone) changes.push("phone");
      if (patch.preferredLanguage) changes.push("language");
      // An account new in this batch is inserted with its latest details; a held one is updated once.
      if (account.id !== 0 && (revive || changes.length)) {
        const held = s.changedAccounts.get(account.id);
        s.changedAccounts.set(account.id, { account, revive: revive || (held?.revive ?? false) });
      }
    }

    const fields = {
      propertyId: home,
      startDate: v.startDate,
      endDate: v.endDate,
      accessNeeds: v.accessNeeds,
      householdVulnerability: v.vulnerability,
    };
    if (!current) {
      s.newTenancies.push({ ...fields, reference: v.reference, account });
    } else {
      const labels = {
        startDate: "start date",
        endDate: "end date",
        accessNeeds: "access needs",
        householdVulnerability: "household vulnerability",
      } as const;
      let changed = false;
      for (const key of Object.keys(labels) as (keyof typeof labels)[]) {
        if ((current[key] ?? null) !== fields[key]) {
          changed = true;
          // Without consent in the file, what was held is removed.
          changes.push(fields[key] === null && key !== "endDate" ? `${labels[key]} removed` : labels[key]);
        }
      }
      if (changed) s.changedTenancies.push({ ...fields, id: current.id });
    }

    if (ended) notes.push(ENDED);
    else if (account.status === "invited" && !s.queuedBefore.has(v.email) && !run.invited.has(v.email)) invite(account);
    const outcome = !current ? "created" : changes.length ? "updated" : "unchanged";
    return { row: v.row, reference: v.reference, outcome, changes, reasons: notes };
  }

  /** The landlord's latest imports, newest first, with their invitations' progress. */
  async list(actor: Actor): Promise<TenancyImportSummary[]> {
    const rows = await this.dataSource.getRepository(TenancyImport).find({
      select: SUMMARY_COLUMNS,
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
    return { fileName: row.fileName, rows: await decodeReport(row.report) };
  }

  /** The batch an import queued, if it is the landlord's. */
  async batchOf(actor: Actor, id: number): Promise<number> {
    const row = await this.dataSource.getRepository(TenancyImport).findOne({
      select: { id: true, invitationBatchId: true },
      where: { id, organisationId: actor.organisationId },
    });
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
