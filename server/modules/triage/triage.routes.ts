import { Router } from "express";
import type { Clock } from "../../lib/clock.js";
import { relatedCasesResponse } from "../../../src/lib/contracts/cases.js";
import { bulkPreviewResponse, bulkUpdateResponse, queuePageResponse, triageResponse } from "../../../src/lib/contracts/triage.js";
import { CASE_TRANSITIONS, canTransition, movesValidForAll } from "../../../src/lib/domain/case-workflow.js";
import { queueExportColumns } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import { EXPORT_PAGE_SIZE, keysetPages, newPageTimes, sendTableExport } from "../../lib/table-export.js";
import { AppError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { CaseService } from "../cases/case.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toQueueItemDto } from "./queue.mapper.js";
import { bulkPreviewSchema, bulkUpdateSchema, queueExportQuerySchema, queueQuerySchema } from "../cases/case-queue.schemas.js";
import type { QueueService } from "../cases/case-queue.service.js";
import type { TriageService } from "./triage.service.js";

/** Mounted at /api/cases before the cases router: the queue, bulk changes, priority breakdown and related cases. */
export function createTriageRouter({
  cases,
  queue,
  triage,
  clock,
}: {
  cases: CaseService;
  queue: QueueService;
  triage: TriageService;
  clock: Clock;
}): Router {
  const router = Router();
  const staff = requireRole("officer", "maintenance", "admin");
  const officers = requireRole("officer", "admin");

  router.get("/", staff, async (req, res) => {
    const query = parse(queueQuerySchema, req.query, "query");
    const now = clock.now();
    const { rows, rooms, total } = await queue.list(actorOf(req), query, now);
    res.json(
      shaped(queuePageResponse, {
        items: rows.map((r) => toQueueItemDto(r, rooms.get(r.id) ?? [], now)),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }),
    );
  });

  // The queue as on screen (filters, sort, shown columns), every page of it, as CSV or .xlsx.
  router.get("/export", staff, async (req, res) => {
    const { format, columns, ...query } = parse(queueExportQuerySchema, req.query, "query");
    const actor = actorOf(req);
    const now = clock.now();
    const times = newPageTimes();
    await sendTableExport(res, {
      format,
      view: "queue",
      now,
      columns: queueExportColumns(now, columns),
      times,
      pages: keysetPages(
        async (after, limit) => {
          const { rows, rooms, last } = await queue.listAfter(actor, query, after, limit, now);
          return { rows: rows.map((r) => toQueueItemDto(r, rooms.get(r.id) ?? [], now)), last };
        },
        EXPORT_PAGE_SIZE,
        times,
      ),
    });
  });

  // Before a bulk status change: the moves valid for every chosen case, and the cases a move would skip.
  router.post("/bulk/preview", officers, async (req, res) => {
    const { ids, status } = parse(bulkPreviewSchema, req.body);
    const actor = actorOf(req);
    const found = [];
    for (const id of [...new Set(ids)]) {
      const c = await cases.getForActor(actor, id).catch((error: unknown) => {
        if (error instanceof AppError) return null;
        throw error;
      });
      if (c) found.push(c);
    }
    res.json(
      shaped(bulkPreviewResponse, {
        common: movesValidForAll(found.map((c) => c.status)),
        cases: found.map((c) => ({
          id: c.id,
          reference: c.reference,
          status: c.status,
          allowed: [...CASE_TRANSITIONS[c.status]],
        })),
        skipped: status
          ? found
              .filter((c) => !canTransition(c.status, status))
              .map((c) => ({ id: c.id, reference: c.reference, status: c.status }))
          : [],
      }),
    );
  });

  router.post("/bulk", officers, async (req, res) => {
    const { ids, status, assigneeId, reason } = parse(bulkUpdateSchema, req.body);
    const actor = actorOf(req);
    const updated: number[] = [];
    const failed: { id: number; reference: string | null; message: string }[] = [];
    // Each case changes in its own transaction, by the same rules as PATCH /api/cases/:id.
    for (const id of [...new Set(ids)]) {
      try {
        await cases.update(actor, id, { status, assigneeId, reason });
        updated.push(id);
      } catch (error) {
        if (!(error instanceof AppError)) throw error;
        const reference = await cases.getForActor(actor, id).then(
          (c) => c.reference,
          () => null,
        );
        failed.push({ id, reference, message: error.message });
      }
    }
    res.json(shaped(bulkUpdateResponse, { updated, failed }));
  });

  router.get("/:id/triage", staff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { score, parts, computedAt } = await triage.breakdown(actorOf(req), id);
    res.json(shaped(triageResponse, { score, parts, computedAt: computedAt.toISOString() }));
  });

  router.get("/:id/related", staff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const c = await cases.getForActor(actorOf(req), id);
    const others = await cases.relatedTo(c);
    res.json(
      shaped(relatedCasesResponse, {
        cases: others.map((o) => ({
          id: o.id,
          reference: o.reference,
          status: o.status,
          awareAt: o.awareAt.toISOString(),
          hazardClass: o.hazardClass,
          description: o.description.slice(0, 200),
        })),
      }),
    );
  });

  return router;
}
