import { Router } from "express";
import { estatesResponse, propertyPageResponse } from "../../../src/lib/contracts/properties.js";
import { homePatchSchema, homeSchema, roomPatchSchema, roomSchema } from "../../../src/lib/schemas/homes.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema, propertyListQuerySchema, roomParamsSchema } from "./properties.schemas.js";
import { toPropertyDto, toPropertySummaryDto, toRoomDto } from "./property.mapper.js";
import type { PropertyService, RoomReadingsCounter } from "./property.service.js";

export function createPropertiesRouter({
  properties,
  roomReadings,
}: {
  properties: PropertyService;
  roomReadings: RoomReadingsCounter;
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
