import { Router } from "express";
import { photoUploadResponse } from "../../../src/lib/contracts/photos.js";
import {
  caseWorkOrdersResponse,
  contractorListResponse,
  verificationResponse,
  workOrderPageResponse,
} from "../../../src/lib/contracts/works.js";
import { WORK_ORDER_EXPORT_COLUMNS } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import type { Clock } from "../../lib/clock.js";
import { EXPORT_PAGE_SIZE, keysetPages, newPageTimes, sendTableExport } from "../../lib/table-export.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import type { Actor } from "../auth/actor.js";
import { toPhotoDto } from "../photos/photo.mapper.js";
import { photoUpload as receivePhotos } from "../photos/photo-upload.js";
import type { PhotoService } from "../photos/photo.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { VerificationService } from "./verification.service.js";
import type { WorkOrder } from "./work-order.entity.js";
import { toContractorDto, toWorkOrderDto } from "./work-order.mapper.js";
import type { WorkOrderService } from "./work-order.service.js";
import {
  bookingResponseSchema,
  contractorSchema,
  verificationOutcomeSchema,
  workOrderCompleteSchema,
  workOrderCreateSchema,
  workOrderExportQuerySchema,
  workOrderListQuerySchema,
  workOrderPatchSchema,
} from "./works.schemas.js";

interface Deps {
  works: WorkOrderService;
  verification: VerificationService;
  photos: PhotoService;
}

const leads = requireRole("maintenance", "admin");

async function dtos(works: WorkOrderService, orders: WorkOrder[], actor: Actor) {
  const ctx = await works.context(orders);
  return orders.map((o) => toWorkOrderDto(o, ctx, actor));
}

/** Mounted at /api/cases: a case's work orders and the check that the fix worked. */
export function createCaseWorksRouter({ works, verification }: Deps): Router {
  const router = Router();
  router.post("/:id/work-orders", requireRole("officer", "maintenance", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const created = await works.create(actorOf(req), id, parse(workOrderCreateSchema, req.body));
    res.status(201).json((await dtos(works, [created], actorOf(req)))[0]);
  });
  router.get("/:id/work-orders", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(
      shaped(caseWorkOrdersResponse, { workOrders: await dtos(works, await works.listForCase(actorOf(req), id), actorOf(req)) }),
    );
  });
  router.get("/:id/verification", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(verificationResponse, await verification.view(actorOf(req), id)));
  });
  router.post("/:id/verification", leads, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    await verification.decide(actorOf(req), id, parse(verificationOutcomeSchema, req.body));
    res.json(shaped(verificationResponse, await verification.view(actorOf(req), id)));
  });
  return router;
}

/** `/api/work-orders`: the maintenance lead's list, scheduling, completion, photos and the tenant's answer. */
export function createWorkOrdersRouter({ works, photos, clock }: Deps & { clock: Clock }): Router {
  const router = Router();
  const photoUpload = receivePhotos(photos.incomingDir);

  router.get("/", requireStaff, async (req, res) => {
    const query = parse(workOrderListQuerySchema, req.query, "query");
    const { items, total } = await works.list(actorOf(req), query);
    res.json(
      shaped(workOrderPageResponse, {
        items: await dtos(works, items, actorOf(req)),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }),
    );
  });

  // The work orders list with its filters and sort, every page of it, as CSV or .xlsx.
  router.get("/export", requireStaff, async (req, res) => {
    const { format, ...query } = parse(workOrderExportQuerySchema, req.query, "query");
    const actor = actorOf(req);
    const times = newPageTimes();
    await sendTableExport(res, {
      format,
      view: "work-orders",
      now: clock.now(),
      columns: WORK_ORDER_EXPORT_COLUMNS,
      times,
      pages: keysetPages(async (after, limit) => works.listAfter(actor, query, after, limit), EXPORT_PAGE_SIZE, times),
    });
  });

  router.patch("/:id", leads, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    // A completion is parsed on its own so that a missing or wrong field is named (complete.doneOn…).
    const body: unknown = req.body;
    const patch =
      body && typeof body === "object" && "complete" in body
        ? parse(workOrderCompleteSchema, body)
        : parse(workOrderPatchSchema, body);
    const actor = actorOf(req);
    const updated =
      "complete" in patch
        ? await works.complete(actor, id, patch.complete)
        : "cancel" in patch
          ? await works.cancel(actor, id, patch.cancel.reason)
          : await works.schedule(actor, id, patch);
    res.json((await dtos(works, [updated], actor))[0]);
  });

  router.post(
    "/:id/photos",
    leads,
    async (req, res, next) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      res.locals.workOrder = await works.getForActor(actorOf(req), id);
      next();
    },
    photoUpload,
    async (req, res) => {
      const wo = res.locals.workOrder as WorkOrder;
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      const added = await photos.addToCase(actorOf(req), wo.caseId, files, { workOrderId: wo.id });
      res.status(201).json(shaped(photoUploadResponse, { photos: added.photos.map(toPhotoDto), refused: added.refused }));
    },
  );

  router.post("/:id/booking-response", requireRole("tenant"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const updated = await works.respond(actorOf(req), id, parse(bookingResponseSchema, req.body));
    res.json((await dtos(works, [updated], actorOf(req)))[0]);
  });

  return router;
}

/** `/api/contractors`. */
export function createContractorsRouter({ works }: Pick<Deps, "works">): Router {
  const router = Router();
  router.get("/", requireStaff, async (req, res) => {
    res.json(shaped(contractorListResponse, { contractors: (await works.contractors(actorOf(req))).map(toContractorDto) }));
  });
  router.post("/", leads, async (req, res) => {
    const k = await works.addContractor(actorOf(req), parse(contractorSchema, req.body));
    res.status(201).json(toContractorDto(k));
  });
  return router;
}
