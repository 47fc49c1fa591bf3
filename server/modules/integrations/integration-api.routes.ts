// The integration API: `/api/v1/…` for a landlord's other systems, authenticated by API key only.
// Every route is declared with its scope in KEY_ROUTES below and reuses the services the session routes
// use, as an officer of the key's landlord (ApiKeyService.authenticate says who).
import express, { Router, type Request, type RequestHandler, type Response } from "express";
import { caseResponse } from "../../../src/lib/contracts/cases.js";
import type { ApiScope } from "../../../src/lib/contracts/integrations.js";
import { propertyPageResponse } from "../../../src/lib/contracts/properties.js";
import { readingsAddedResponse } from "../../../src/lib/contracts/readings.js";
import { queuePageResponse } from "../../../src/lib/contracts/triage.js";
import { workOrderPageResponse } from "../../../src/lib/contracts/works.js";
import { staffCaseSchema } from "../../../src/lib/schemas/case-report.js";
import type { Clock } from "../../lib/clock.js";
import { shaped } from "../../lib/contract.js";
import { ConflictError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { parse } from "../../lib/validation.js";
import { apiNotFound } from "../../middleware/error-handler.js";
import type { Actor } from "../auth/actor.js";
import { queueQuerySchema } from "../cases/case-queue.schemas.js";
import type { QueueService } from "../cases/case-queue.service.js";
import { toCaseDto } from "../cases/case.mapper.js";
import type { CaseService } from "../cases/case.service.js";
import { idParamsSchema, propertyListQuerySchema } from "../properties/properties.schemas.js";
import { toPropertyDto, toPropertySummaryDto } from "../properties/property.mapper.js";
import type { PropertyService } from "../properties/property.service.js";
import { manualReadingsSchema } from "../readings/readings.schemas.js";
import type { ReadingService } from "../readings/reading.service.js";
import { requireRoomOfCase } from "../readings/room-of-case.js";
import { toQueueItemDto } from "../triage/queue.mapper.js";
import { toWorkOrderDto } from "../works/work-order.mapper.js";
import type { WorkOrderService } from "../works/work-order.service.js";
import { workOrderListQuerySchema } from "../works/works.schemas.js";
import type { ApiKeyService } from "./api-key.service.js";
import { homeUpsertSchema, uprnParamsSchema } from "./integrations.schemas.js";
import type { RateLimits } from "../../middleware/rate-limit.js";
import { auditKeyWrites, authenticateKey, callerOf, limitPerKey, requireScope } from "./key-auth.js";

interface Deps {
  keys: ApiKeyService;
  properties: PropertyService;
  cases: CaseService;
  queue: QueueService;
  readings: ReadingService;
  works: WorkOrderService;
  /** Tells officers when new readings make the case risky (EvaluationService). */
  evaluation: { alertIfRisky(actor: Actor, caseId: number): Promise<void> };
  clock: Clock;
  logger: Logger;
  requestsPerMinute: number;
  rateLimits: RateLimits;
  /** Idempotency-Key handling (server/middleware/idempotency.ts), scoped to the calling key. */
  idempotency?: RequestHandler;
}

type Handler = (req: Request, res: Response, actor: Actor) => Promise<void>;

/** One key route: method, path under /api/v1, the scope it needs, and what it does. */
export interface KeyRoute {
  method: "get" | "post" | "put";
  path: string;
  scope: ApiScope;
  handle: Handler;
}

function keyRoutes({ properties, cases, queue, readings, works, evaluation, clock }: Deps): KeyRoute[] {
  const upsert = async (actor: Actor, uprn: string, body: ReturnType<typeof homeUpsertSchema.parse>) => {
    const { rooms: _rooms, ...fields } = body;
    const existing = await properties.idByUprn(actor, uprn);
    if (existing !== null) return { created: false, home: await properties.update(actor, existing, { ...fields, uprn }) };
    return { created: true, home: await properties.create(actor, { ...body, uprn }) };
  };

  return [
    {
      method: "get",
      path: "/homes",
      scope: "homes:read",
      handle: async (req, res, actor) => {
        const query = parse(propertyListQuerySchema, req.query, "query");
        const { items, total } = await properties.list(actor, query);
        res.json(
          shaped(propertyPageResponse, {
            items: items.map(toPropertySummaryDto),
            total,
            page: query.page,
            pageSize: query.pageSize,
          }),
        );
      },
    },
    {
      method: "get",
      path: "/homes/:id",
      scope: "homes:read",
      handle: async (req, res, actor) => {
        const { id } = parse(idParamsSchema, req.params, "params");
        res.json(toPropertyDto(await properties.getForStaff(actor, id)));
      },
    },
    {
      method: "put",
      path: "/homes/by-uprn/:uprn",
      scope: "homes:write",
      handle: async (req, res, actor) => {
        const { uprn } = parse(uprnParamsSchema, req.params, "params");
        const body = parse(homeUpsertSchema, req.body);
        // Two systems sending the same new UPRN at once: the second finds the first's home and updates it.
        const outcome = await upsert(actor, uprn!, body).catch(async (error: unknown) => {
          if (error instanceof ConflictError) return upsert(actor, uprn!, body);
          throw error;
        });
        res.status(outcome.created ? 201 : 200).json(toPropertyDto(outcome.home));
      },
    },
    {
      method: "get",
      path: "/cases",
      scope: "cases:read",
      handle: async (req, res, actor) => {
        const query = parse(queueQuerySchema, req.query, "query");
        const now = clock.now();
        const { rows, rooms, total } = await queue.list(actor, query, now);
        res.json(
          shaped(queuePageResponse, {
            items: rows.map((r) => toQueueItemDto(r, rooms.get(r.id) ?? [], now)),
            total,
            page: query.page,
            pageSize: query.pageSize,
          }),
        );
      },
    },
    {
      method: "get",
      path: "/cases/:id",
      scope: "cases:read",
      handle: async (req, res, actor) => {
        const { id } = parse(idParamsSchema, req.params, "params");
        res.json(shaped(caseResponse, toCaseDto(await cases.getForActor(actor, id), "staff")));
      },
    },
    {
      method: "post",
      path: "/cases",
      scope: "cases:write",
      handle: async (req, res, actor) => {
        const input = parse(staffCaseSchema, req.body);
        res.status(201).json(shaped(caseResponse, toCaseDto(await cases.create(actor, input), "staff")));
      },
    },
    {
      method: "post",
      path: "/cases/:id/readings",
      scope: "cases:write",
      handle: async (req, res, actor) => {
        const { id } = parse(idParamsSchema, req.params, "params");
        const c = await cases.getForActor(actor, id);
        const input = parse(manualReadingsSchema, req.body);
        requireRoomOfCase(
          input.map((r) => r.roomId),
          cases.roomsOf(c),
        );
        const result = await readings.addManual(
          c.id,
          input.map((r) => ({ ...r, takenAt: new Date(r.takenAt) })),
          { actorId: actor.id },
        );
        await evaluation.alertIfRisky(actor, c.id);
        res.status(201).json(shaped(readingsAddedResponse, { ...result, rejected: 0 }));
      },
    },
    {
      method: "get",
      path: "/work-orders",
      scope: "works:read",
      handle: async (req, res, actor) => {
        const query = parse(workOrderListQuerySchema, req.query, "query");
        const { items, total } = await works.list(actor, query);
        const ctx = await works.context(items);
        res.json(
          shaped(workOrderPageResponse, {
            items: items.map((o) => toWorkOrderDto(o, ctx, actor)),
            total,
            page: query.page,
            pageSize: query.pageSize,
          }),
        );
      },
    },
  ];
}

/** Mounted at /api/v1 before the session middleware: a session cookie is never looked at here. */
export function createIntegrationApiRouter(deps: Deps): Router {
  const router = Router();
  const { keys } = deps;
  router.use(authenticateKey(keys));
  router.use(auditKeyWrites(keys, deps.logger));
  router.use(limitPerKey(deps.rateLimits, deps.requestsPerMinute));
  router.use(express.json({ limit: "2mb" }));
  if (deps.idempotency) router.use(deps.idempotency);
  for (const route of keyRoutes(deps)) {
    router[route.method](route.path, requireScope(keys, route.scope), async (req, res) => {
      await route.handle(req, res, callerOf(req).actor);
    });
  }
  router.use(apiNotFound);
  return router;
}
