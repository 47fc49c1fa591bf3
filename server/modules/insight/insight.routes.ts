import { Router } from "express";
import { dashboardResponse, INSIGHT_COLUMNS, whatWorksResponse, type InsightTable } from "../../../src/lib/contracts/insight.js";
import type { ExportColumn } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import { sendTableExport } from "../../lib/table-export.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { Clock } from "../../lib/clock.js";
import type { Actor } from "../auth/actor.js";
import { insightExportQuerySchema, insightQuerySchema, type InsightQuery } from "./insight.schemas.js";
import type { InsightService } from "./insight.service.js";

/** Mounted at /api/insight: the compliance dashboard, "what works", and each of their tables as a file. Staff only. */
export function createInsightRouter({ insight, clock }: { insight: InsightService; clock: Clock }): Router {
  const router = Router();
  router.use(requireRole("officer", "maintenance", "admin"));

  router.get("/dashboard", async (req, res) => {
    const query = parse(insightQuerySchema, req.query, "query");
    res.json(shaped(dashboardResponse, await insight.dashboard(actorOf(req), query)));
  });

  router.get("/what-works", async (req, res) => {
    const query = parse(insightQuerySchema, req.query, "query");
    res.json(shaped(whatWorksResponse, await insight.whatWorks(actorOf(req), query)));
  });

  // One table of the page, as on screen (same filters, same headings), as CSV or .xlsx.
  router.get("/export", async (req, res) => {
    const { table, format, ...query } = parse(insightExportQuerySchema, req.query, "query");
    const rows = await tableRows(insight, actorOf(req), query, table);
    async function* pages() {
      yield rows;
    }
    await sendTableExport(res, {
      format,
      view: `dashboard-${table}`,
      now: clock.now(),
      columns: INSIGHT_COLUMNS[table] as ExportColumn<unknown>[],
      pages: pages(),
    });
  });

  return router;
}

async function tableRows(
  insight: InsightService,
  actor: Actor,
  query: InsightQuery,
  table: InsightTable,
): Promise<readonly unknown[]> {
  if (table === "what-works") return (await insight.whatWorks(actor, query)).groups;
  const d = await insight.dashboard(actor, query);
  const byTable: Record<Exclude<InsightTable, "what-works">, readonly unknown[]> = {
    "open-status": d.open.byStatus,
    "open-risk": d.open.byRisk,
    "open-category": d.open.byCategory,
    stages: d.stages,
    "stages-by-month": d.stagesByMonth,
    durations: d.durations,
    hotspots: d.hotspots,
    seasonal: d.seasonal,
    officers: d.officers,
    operatives: d.operatives,
    complaints: d.complaints.stages,
  };
  return byTable[table];
}
