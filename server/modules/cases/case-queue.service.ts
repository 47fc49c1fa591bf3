import { Brackets, type DataSource, type ObjectLiteral, type SelectQueryBuilder } from "typeorm";
import type { DeadlineStage, HazardClass } from "../../../src/lib/domain/deadlines.js";
import type { SurfaceState } from "../../../src/lib/domain/surface.js";
import type { Area, CaseStatus, Channel } from "../../../src/lib/schemas/case-report.js";
import { CASE_STATUSES } from "../../../src/lib/domain/case-workflow.js";
import { SURFACE_STATES } from "../../../src/lib/domain/surface.js";
import { TRIAGE_AREAS } from "../../../src/lib/domain/triage-priority.js";
import { searchPatterns } from "../../lib/sql.js";
import { keysetAfter, type KeyTerm, type KeysetPage } from "../../lib/table-export.js";
import type { Actor } from "../auth/actor.js";
import type { QueueQuery, QueueSort } from "./case-queue.schemas.js";
import { Case } from "./case.entity.js";
import { figuresDue } from "./case.service.js";
import type { HomeSearchService } from "../properties/home-search.service.js";

/** Works out the stored figures a change or the clock marked stale (the triage module provides it). */
export interface StaleFiguresRefresher {
  refreshStale(organisationId: number, limit: number): Promise<unknown>;
  /** Whether any of the landlord's cases has figures due to be worked out again. */
  hasStale(organisationId: number): Promise<boolean>;
}
import type { Clock } from "../../lib/clock.js";

export interface QueueRow {
  id: number;
  reference: string;
  status: CaseStatus;
  channel: Channel;
  awareAt: Date;
  createdAt: Date;
  propertyId: number;
  addressLine1: string;
  town: string;
  postcode: string;
  estate: string;
  block: string | null;
  riskState: SurfaceState | null;
  mouldIndex: string | null;
  area: Area | null;
  vulnerableHousehold: number;
  hazardClass: HazardClass | null;
  hhsrsBand: string | null;
  hhsrsCategory: number | null;
  priority: number;
  nextStage: DeadlineStage | null;
  nextDueAt: Date | null;
  assigneeId: number | null;
  assigneeName: string | null;
}

const sqlList = (values: readonly string[]) => values.map((v) => `'${v}'`).join(", ");

/**
 * Sort expressions. Fixed strings only (never user text). Nullable columns sort their nulls last
 * in both directions; ordered vocabularies sort in their meaning's order, not alphabetically.
 */
const SORTS: Record<Exclude<QueueSort, "priority">, { expr: string; nullable: boolean }> = {
  reference: { expr: "c.reference", nullable: false },
  address: { expr: "NATURAL_SORT_KEY(p.address_line1)", nullable: false },
  estate: { expr: "p.estate", nullable: false },
  rooms: {
    expr: "(SELECT MIN(r.name) FROM case_rooms cr JOIN rooms r ON r.id = cr.room_id WHERE cr.case_id = c.id)",
    nullable: true,
  },
  awareAt: { expr: "c.aware_at", nullable: false },
  channel: { expr: "c.channel", nullable: false },
  // FIELD() gives 0 for NULL: no readings sorts below dry.
  risk: { expr: `FIELD(c.risk_state, ${sqlList(SURFACE_STATES)})`, nullable: false },
  mouldIndex: { expr: "c.mould_index", nullable: true },
  area: { expr: `FIELD(c.area, ${sqlList(TRIAGE_AREAS)})`, nullable: true },
  vulnerable: { expr: "c.vulnerable_household", nullable: false },
  // Band A is the most serious; ascending puts A first.
  band: { expr: "c.hhsrs_band", nullable: true },
  due: { expr: "c.next_due_at", nullable: true },
  status: { expr: `FIELD(c.status, ${sqlList(CASE_STATUSES)})`, nullable: false },
  assignee: { expr: "u.name", nullable: true },
};

/** The columns of a queue row (`c` the case, `p` its home, `u` the assignee). */
const ROW_COLUMNS = [
  "c.id AS id",
  "c.reference AS reference",
  "c.status AS status",
  "c.channel AS channel",
  "c.aware_at AS awareAt",
  "c.created_at AS createdAt",
  "p.id AS propertyId",
  "p.address_line1 AS addressLine1",
  "p.town AS town",
  "p.postcode AS postcode",
  "p.estate AS estate",
  "p.block AS block",
  "c.risk_state AS riskState",
  "c.mould_index AS mouldIndex",
  "c.area AS area",
  "c.vulnerable_household AS vulnerableHousehold",
  "c.hazard_class AS hazardClass",
  "c.hhsrs_band AS hhsrsBand",
  "c.hhsrs_category AS hhsrsCategory",
  "c.priority AS priority",
  "c.next_stage AS nextStage",
  "c.next_due_at AS nextDueAt",
  "u.id AS assigneeId",
  "u.name AS assigneeName",
];

/**
 * From this offset on, a page in the default order starts at its priority (prioritySeek). Measured on
 * bench:queue's 100 000 cases: page 2 000 walked 50 000 index entries in 12–24 ms, and from its priority
 * took 0.6–0.8 ms after ~1 ms for the counts. A walk of 1 000 entries (~0.3 ms) is cheaper than the counts.
 */
const DEEP_OFFSET = 1000;

/** Above this many matching homes a search joins the homes instead of listing their ids. */
const MAX_SEARCH_HOMES = 2000;

/** Whether the query filters by status alone (or not at all), so its total is a sum of stored counts. */
function onlyStatusFilter(query: QueueQuery): boolean {
  const { risk, category, band, estate, vulnerable, overdue, dueWithin, assignee, q } = query;
  return [risk, category, band, estate, vulnerable, overdue, dueWithin, assignee, q].every((v) => v === undefined);
}

/** Sorts whose expression reads the home (`p`). */
const SORTS_ON_PROPERTY = new Set<QueueSort>(["address", "estate"]);

/** The queue's ORDER BY, term by term; the last term (the id) makes it total, so a keyset can follow it. */
function sortTerms(query: Pick<QueueQuery, "sort" | "order">): KeyTerm[] {
  if (query.sort === "priority") {
    // The default order, served by idx_cases_queue: priority, then the nearest deadline.
    const desc = query.order !== "asc";
    return [{ expr: "c.priority", desc }, { expr: "c.next_due_at", desc: !desc, nullable: true }, { expr: "c.id" }];
  }
  const { expr, nullable } = SORTS[query.sort];
  const desc = query.order === "desc";
  return [...(nullable ? [{ expr: `(${expr}) IS NULL` }] : []), { expr, desc, nullable }, { expr: "c.id" }];
}

/** The queue's ORDER BY as SQL (fixed expressions only). */
const orderBy = (query: Pick<QueueQuery, "sort" | "order">) =>
  sortTerms(query)
    .map((t) => `${t.expr} ${t.desc ? "DESC" : "ASC"}`)
    .join(", ");

/** Each row's rooms, by name as roomsOf gives them, as a JSON array (`c` the case). */
const ROOMS_JSON =
  "(SELECT JSON_ARRAYAGG(JSON_OBJECT('id', r.id, 'name', r.name) ORDER BY r.name) FROM case_rooms cr JOIN rooms r ON r.id = cr.room_id WHERE cr.case_id = c.id)";

/** How many of the landlord's cases have one of `statuses` (every status when left out), from the counts kept by triggers. */
function storedCountSql(organisationId: number, statuses: readonly string[] | undefined): { sql: string; params: unknown[] } {
  return statuses?.length
    ? {
        sql: "SELECT COALESCE(SUM(n), 0) AS n FROM case_status_counts WHERE organisation_id = ? AND status IN (?)",
        params: [organisationId, statuses],
      }
    : { sql: "SELECT COALESCE(SUM(n), 0) AS n FROM case_status_counts WHERE organisation_id = ?", params: [organisationId] };
}

/** The officers' queue: one landlord's cases filtered, sorted and paged on the stored triage figures. */
export class QueueService {
  /** Per landlord: the refresh of stale figures running now, and the one queued behind it. */
  private readonly refreshes = new Map<number, { running: Promise<void>; next?: Promise<void> }>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly figures: StaleFiguresRefresher,
    private readonly clock: Clock,
    private readonly homeSearch: Pick<HomeSearchService, "matching">,
  ) {}

  async list(
    actor: Actor,
    query: QueueQuery,
    now = this.clock.now(),
  ): Promise<{ rows: QueueRow[]; rooms: Map<number, { id: number; name: string }[]>; total: number }> {
    const org = actor.organisationId;
    // Figures marked stale by a change (or by the clock) are worked out before anyone reads them. A
    // refresh already running for the landlord is waited for; otherwise whether any case is stale is
    // asked beside the page itself, which is read again after a refresh only if one was (rarely):
    // one round trip to MariaDB fewer per page than asking first (bench:queue).
    const refreshing = this.refreshes.has(org);
    if (refreshing) await this.refreshStale(org);

    const homes = await this.homesMatching(org, query.q);
    const base = this.dataSource
      .getRepository(Case)
      .createQueryBuilder("c")
      .where("c.organisation_id = :org", { org: actor.organisationId });
    const needsProperty = this.applyFilters(base, actor, query, now, homes);

    // The page's ids first, from the cases alone where the filters and the sort allow, then the
    // rows for those ids (a deferred join). For the default order MariaDB walks idx_cases_queue
    // and steps over a deep page's offset inside the index, instead of joining every case to its
    // home and sorting them all (bench:queue: page 2000 went from ~700 ms to ~10 ms).
    // The same query brings, with each row, the things the page needs once (MariaDB works out a
    // subquery that does not depend on the row once): whether any of the landlord's cases has figures
    // due to be worked out again, and, for the queue's usual views (the open cases, one status, every
    // case), the total from the counts MariaDB keeps per landlord and status (migration
    // CaseStatusCounts); other views count their cases beside the page. One statement instead of three
    // per page view (bench:queue). An empty page asks for them on their own.
    const storedTotal = onlyStatusFilter(query);
    const once: string[] = [];
    const onceParams: unknown[] = [];
    if (!refreshing) {
      once.push(`EXISTS (SELECT 1 FROM cases s WHERE s.organisation_id = ? AND ${figuresDue("s", "?")}) AS anyStale`);
      onceParams.push(org, now);
    }
    if (storedTotal) {
      const { sql, params } = storedCountSql(org, query.status);
      once.push(`(${sql}) AS total`);
      onceParams.push(...params);
    }
    const offset = (query.page - 1) * query.pageSize;
    // A deep page in the default order starts at its priority's first case (prioritySeek): asked again
    // after a refresh of stale figures, which may have moved cases between priorities.
    const seeks = query.sort === "priority" && storedTotal && offset >= DEEP_OFFSET;
    const listQuery = async (): Promise<[string, unknown[]]> => {
      const page = base.clone().select("c.id", "id");
      if (needsProperty || SORTS_ON_PROPERTY.has(query.sort)) page.innerJoin("c.property", "p");
      if (query.sort === "assignee") page.leftJoin("users", "u", "u.id = c.assignee_user_id");
      this.applySort(page, query);
      const desc = query.order !== "asc";
      const seek = seeks ? await this.prioritySeek(org, query.status, desc, offset) : null;
      if (seek) page.andWhere(`c.priority ${desc ? "<=" : ">="} :seekPriority`, { seekPriority: seek.priority });
      page.offset(seek ? seek.offset : offset).limit(query.pageSize);
      const [pageSql, pageParams] = page.getQueryAndParameters();
      const sql =
        `SELECT ${ROW_COLUMNS.join(", ")}, ${ROOMS_JSON} AS roomsJson${once.map((o) => `, ${o}`).join("")} ` +
        `FROM (${pageSql}) page INNER JOIN cases c ON c.id = page.id INNER JOIN properties p ON p.id = c.property_id ` +
        `LEFT JOIN users u ON u.id = c.assignee_user_id ORDER BY ${orderBy(query)}`;
      return [sql, [...onceParams, ...pageParams]];
    };
    const counter = storedTotal ? null : base.clone().select("COUNT(*)", "n");
    if (needsProperty) counter?.innerJoin("c.property", "p");

    type ListRow = QueueRow & { roomsJson: unknown; anyStale?: number | string; total?: number | string };
    const read = async (askStale: boolean) => {
      const [listSql, listParams] = await listQuery();
      const [rows, counted] = await Promise.all([
        this.dataSource.query(listSql, listParams) as Promise<ListRow[]>,
        counter?.getRawOne<{ n: string | number }>().then((r) => Number(r?.n ?? 0)) ?? null,
      ]);
      const first = rows[0];
      const [stale, total] = first
        ? [Number(first.anyStale ?? 0) === 1, counted ?? Number(first.total ?? 0)]
        : await Promise.all([askStale ? this.figures.hasStale(org) : false, counted ?? this.storedCount(org, query.status)]);
      return { rows, total, stale };
    };
    const first = await read(!refreshing);
    let { rows, total } = first;
    if (!refreshing && first.stale) {
      await this.refreshStale(org);
      ({ rows, total } = await read(false));
    }
    const rooms = new Map<number, { id: number; name: string }[]>();
    for (const r of rows) {
      // mysql2 hands a JSON result over parsed; text is parsed here.
      const value = typeof r.roomsJson === "string" ? (JSON.parse(r.roomsJson) as unknown) : r.roomsJson;
      rooms.set(r.id, (value ?? []) as { id: number; name: string }[]);
      delete r.roomsJson;
      delete r.anyStale;
      delete r.total;
    }
    return { rows, rooms, total };
  }

  /**
   * For exports: the next `limit` rows of the queue in its order, after the row whose sort values are
   * `after` (null: from the top), with this page's last sort values. A keyset, not an offset: the
   * 100th page costs what the first does. Stale figures are worked out once, before the first page.
   */
  async listAfter(
    actor: Actor,
    query: Omit<QueueQuery, "page" | "pageSize">,
    after: readonly unknown[] | null,
    limit: number,
    now = this.clock.now(),
  ): Promise<KeysetPage<QueueRow> & { rooms: Map<number, { id: number; name: string }[]> }> {
    if (!after) await this.refreshStale(actor.organisationId);
    const full = { ...query, page: 1, pageSize: limit };
    const terms = sortTerms(full);
    const homes = await this.homesMatching(actor.organisationId, query.q);
    const page = this.dataSource
      .getRepository(Case)
      .createQueryBuilder("c")
      .where("c.organisation_id = :org", { org: actor.organisationId });
    const needsProperty = this.applyFilters(page, actor, full, now, homes);
    if (needsProperty || SORTS_ON_PROPERTY.has(query.sort)) page.innerJoin("c.property", "p");
    if (query.sort === "assignee") page.leftJoin("users", "u", "u.id = c.assignee_user_id");
    page.select("c.id", "id");
    terms.forEach((term, i) => page.addSelect(term.expr, `k${i}`));
    if (after) {
      const { sql, params } = keysetAfter(terms, after);
      page.andWhere(sql, params);
    }
    this.applySort(page, full);
    page.limit(limit);
    const keys = await page.getRawMany<Record<string, unknown>>();
    if (!keys.length) return { rows: [], last: null, rooms: new Map() };

    const ids = keys.map((k) => Number(k.id));
    const list = this.rowsQuery().where("c.id IN (:...ids)", { ids });
    this.applySort(list, full);
    const rows = await list.getRawMany<QueueRow>();
    const tail = keys.at(-1)!;
    return { rows, last: terms.map((_, i) => tail[`k${i}`] ?? null), rooms: await this.roomsOf(ids) };
  }

  private rowsQuery() {
    return this.dataSource
      .getRepository(Case)
      .createQueryBuilder("c")
      .innerJoin("c.property", "p")
      .leftJoin("users", "u", "u.id = c.assignee_user_id")
      .select(ROW_COLUMNS);
  }

  /**
   * One refresh of a landlord's stale figures at a time. Readers who arrive while one runs wait for
   * a single further run (which also covers cases marked stale meanwhile), rather than each
   * refreshing the same cases at once: twenty officers opening the queue together used to queue
   * on the same row locks, each holding a pooled connection, until they timed out (bench:queue).
   */
  private refreshStale(organisationId: number): Promise<void> {
    const current = this.refreshes.get(organisationId);
    if (current)
      return (current.next ??= current.running.then(
        () => this.startRefresh(organisationId),
        () => this.startRefresh(organisationId),
      ));
    return this.startRefresh(organisationId);
  }

  private startRefresh(organisationId: number): Promise<void> {
    const running = this.figures.refreshStale(organisationId, 50).then(() => undefined);
    const entry: { running: Promise<void>; next?: Promise<void> } = { running };
    this.refreshes.set(organisationId, entry);
    // The queued run (if any) has replaced this entry by the time this runs; otherwise the landlord is idle.
    void running
      .catch(() => undefined)
      .then(() => {
        if (this.refreshes.get(organisationId) === entry && !entry.next) this.refreshes.delete(organisationId);
      });
    return running;
  }

  /**
   * Where a deep page of the default order starts, from the counts MariaDB keeps per landlord, status
   * and priority (migration CasePriorityCounts): the priority its first case has, and how many of that
   * priority's cases come before it. The page is then `priority <= p` (`>=` ascending) from that
   * offset, the same rows as the plain offset, while MariaDB walks at most one priority's cases
   * instead of every case before the page. Null past the last case (the plain offset answers it).
   * Counted and paged in two statements, so a case written in between can shift the page by a row, as
   * it can between any two page views.
   */
  private async prioritySeek(
    organisationId: number,
    statuses: readonly string[] | undefined,
    desc: boolean,
    offset: number,
  ): Promise<{ priority: number; offset: number } | null> {
    const rows = (await this.dataSource.query(
      `SELECT priority, SUM(n) AS n FROM case_priority_counts WHERE organisation_id = ?${statuses?.length ? " AND status IN (?)" : ""} ` +
        `GROUP BY priority ORDER BY priority ${desc ? "DESC" : "ASC"}`,
      statuses?.length ? [organisationId, statuses] : [organisationId],
    )) as { priority: number | string; n: number | string }[];
    let before = 0;
    for (const row of rows) {
      const n = Number(row.n);
      if (offset < before + n) return { priority: Number(row.priority), offset: offset - before };
      before += n;
    }
    return null;
  }

  /** How many of the landlord's cases have one of `statuses` (every status when left out), from the stored counts. */
  private async storedCount(organisationId: number, statuses: readonly string[] | undefined): Promise<number> {
    const { sql, params } = storedCountSql(organisationId, statuses);
    const [row] = (await this.dataSource.query(sql, params)) as { n: string | number }[];
    return Number(row?.n ?? 0);
  }

  /**
   * The landlord's homes whose address, town or postcode hold the search text, found once per request
   * so the page and its total both filter cases by home id (the properties module's search, through
   * the homes' three-character pieces). Null when there is no search, or when so many homes match that
   * a list of ids would cost more than the join.
   */
  private async homesMatching(organisationId: number, q: string | undefined): Promise<number[] | null> {
    if (!q) return null;
    return this.homeSearch.matching(organisationId, q, MAX_SEARCH_HOMES);
  }

  /** Adds the WHERE clauses; says whether any of them needs the home (`p`). `homes`: the homes matching `q` (homesMatching). */
  private applyFilters(
    qb: SelectQueryBuilder<Case>,
    actor: Actor,
    query: QueueQuery,
    now: Date,
    homes: number[] | null,
  ): boolean {
    let needsProperty = false;
    if (query.status?.length) qb.andWhere("c.status IN (:...statuses)", { statuses: query.status });
    if (query.risk?.length) {
      const states = query.risk.filter((r) => r !== "unknown");
      const unknown = query.risk.includes("unknown");
      qb.andWhere(
        new Brackets((w) => {
          if (states.length) w.orWhere("c.risk_state IN (:...states)", { states });
          if (unknown) w.orWhere("c.risk_state IS NULL");
        }),
      );
    }
    if (query.category?.length) {
      const categories = query.category.filter((v) => v !== "none").map(Number);
      const none = query.category.includes("none");
      qb.andWhere(
        new Brackets((w) => {
          if (categories.length) w.orWhere("c.hhsrs_category IN (:...categories)", { categories });
          if (none) w.orWhere("c.hhsrs_category IS NULL");
        }),
      );
    }
    if (query.band?.length) qb.andWhere("c.hhsrs_band IN (:...bands)", { bands: query.band });
    if (query.estate) {
      qb.andWhere("p.estate = :estate", { estate: query.estate });
      needsProperty = true;
    }
    if (query.vulnerable !== undefined) qb.andWhere("c.vulnerable_household = :vulnerable", { vulnerable: query.vulnerable });
    if (query.overdue === true) qb.andWhere("c.next_due_at < :now", { now });
    if (query.overdue === false) qb.andWhere("(c.next_due_at IS NULL OR c.next_due_at >= :now)", { now });
    if (query.dueWithin !== undefined)
      qb.andWhere("c.next_due_at <= :dueBy", { dueBy: new Date(now.getTime() + query.dueWithin * 86_400_000) });
    if (query.assignee === "me") qb.andWhere("c.assignee_user_id = :me", { me: actor.id });
    else if (query.assignee === "unassigned") qb.andWhere("c.assignee_user_id IS NULL");
    else if (query.assignee) qb.andWhere("c.assignee_user_id = :assignee", { assignee: Number(query.assignee) });
    if (query.q) {
      const { like, compact } = searchPatterns(query.q);
      // A reference is DW-, a year, a dash and digits (formatReference): text holding any other
      // ASCII letter cannot be part of one. Leaving that test out of the OR lets MariaDB use the
      // home's columns alone: with it, every case has to be joined to its home and tested
      // (bench:queue: a street name went from ~450 ms to ~10 ms for the page, ~15 ms for the count).
      const mayBeReference = !/[a-ce-vx-z]/i.test(query.q);
      qb.andWhere(
        new Brackets((w) => {
          if (mayBeReference) w.orWhere("c.reference LIKE :like", { like });
          if (homes === null)
            w.orWhere("p.address_line1 LIKE :like", { like })
              .orWhere("p.town LIKE :like", { like })
              .orWhere("REPLACE(p.postcode, ' ', '') LIKE :compact", { compact });
          else if (homes.length) w.orWhere("c.property_id IN (:...homes)", { homes });
          else if (!mayBeReference) w.orWhere("FALSE");
        }),
      );
      if (homes === null) needsProperty = true;
    }
    return needsProperty;
  }

  private applySort(qb: SelectQueryBuilder<ObjectLiteral>, query: QueueQuery) {
    qb.orderBy();
    for (const term of sortTerms(query)) qb.addOrderBy(term.expr, term.desc ? "DESC" : "ASC");
  }

  private async roomsOf(caseIds: number[]): Promise<Map<number, { id: number; name: string }[]>> {
    const out = new Map<number, { id: number; name: string }[]>();
    if (!caseIds.length) return out;
    const rows: { caseId: number; id: number; name: string }[] = await this.dataSource.query(
      "SELECT cr.case_id AS caseId, r.id AS id, r.name AS name FROM case_rooms cr JOIN rooms r ON r.id = cr.room_id WHERE cr.case_id IN (?) ORDER BY r.name",
      [caseIds],
    );
    for (const r of rows) out.set(r.caseId, [...(out.get(r.caseId) ?? []), { id: r.id, name: r.name }]);
    return out;
  }
}
