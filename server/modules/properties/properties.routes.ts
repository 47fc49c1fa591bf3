import { Router } from "express";
import { estatesResponse, propertyPageResponse } from "../../../src/lib/contracts/properties.js";
import { homePatchSchema, homeSchema, roomPatchSchema, roomSchema } from "../../../src/lib/schemas/homes.js";
import { HOME_EXPORT_COLUMNS } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import type { Clock } from "../../lib/clock.js";
import { EXPORT_PAGE_SIZE, keysetPages, newPageTimes, sendTableExport } from "../../lib/table-export.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema, propertyExportQuerySchema, propertyListQuerySchema, roomParamsSchema } from "./properties.schemas.js";
import { toPropertyDto, toPropertySummaryDto, toRoomDto } from "./property.mapper.js";
import type { PropertyService, RoomReadingsCounter } from "./property.service.js";

export function createPropertiesRouter({
  properties,
  roomReadings,
  clock,
}: {
  properties: PropertyService;
  roomReadings: RoomReadingsCounter;
  clock: Clock;
}): Router {
  const router = Router();
  router.use(requireStaff);

  router.get("/", async (req, res) => {
    const query = parse(propertyListQuerySchema, req.query, "query");
    const { items, total } = await properties.list(actorOf(req), query);
    res.json(
      shaped(propertyPageResponse, { items: items.map(toPropertySummaryDto), total, page: query.page, pageSize: query.pageSize }),
    );
  });

  // The homes list with its filters, every page of it, as CSV or .xlsx.
  router.get("/export", async (req, res) => {
    const { format, ...query } = parse(propertyExportQuerySchema, req.query, "query");
    const actor = actorOf(req);
    const times = newPageTimes();
    await sendTableExport(res, {
      format,
      view: "homes",
      now: clock.now(),
      columns: HOME_EXPORT_COLUMNS,
      times,
      pages: keysetPages(
        async (after, limit) => {
          const { rows, last } = await properties.listAfter(actor, query, after, limit);
          return { rows: rows.map(toPropertySummaryDto), last };
        },
        EXPORT_PAGE_SIZE,
        times,
      ),
    });
  });

  router.get("/estates", async (req, res) => {
    res.json(shaped(estatesResponse, { estates: await properties.estates(actorOf(req)) }));
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(toPropertyDto(await properties.getForStaff(actorOf(req), id)));
  });

  // Admins add and edit homes and rooms of their own organisation.
  router.post("/", requireRole("admin"), async (req, res) => {
    const input = parse(homeSchema, req.body);
    res.status(201).json(toPropertyDto(await properties.create(actorOf(req), input)));
  });

  router.patch("/:id", requireRole("admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const patch = parse(homePatchSchema, req.body);
    res.json(toPropertyDto(await properties.update(actorOf(req), id, patch)));
  });

  router.post("/:id/rooms", requireRole("admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const input = parse(roomSchema, req.body);
    res.status(201).json(toRoomDto(await properties.addRoom(actorOf(req), id, input)));
  });

  router.patch("/:id/rooms/:roomId", requireRole("admin"), async (req, res) => {
    const { id, roomId } = parse(roomParamsSchema, req.params, "params");
    const patch = parse(roomPatchSchema, req.body);
    res.json(toRoomDto(await properties.updateRoom(actorOf(req), id, roomId, patch)));
  });

  router.delete("/:id/rooms/:roomId", requireRole("admin"), async (req, res) => {
    const { id, roomId } = parse(roomParamsSchema, req.params, "params");
    await properties.deleteRoom(actorOf(req), id, roomId, roomReadings);
    res.status(204).end();
  });

  return router;
}
