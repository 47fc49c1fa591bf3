import { Router } from "express";
import { sensorAttentionPageResponse } from "../../../src/lib/contracts/sensor-health.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toSensorAttentionDto, toSensorHealthDto, toSensorHealthSummaryDto } from "./sensor-health.mapper.js";
import { sensorAttentionQuerySchema } from "./sensor-health.schemas.js";
import type { SensorHealthService } from "./sensor-health.service.js";

/** `/api/sensor-health`: for staff of the sensors' landlord (the maintenance lead and admins; officers read). */
export function createSensorHealthRouter({ sensorHealth }: { sensorHealth: SensorHealthService }): Router {
  const router = Router();
  router.use(requireStaff);

  router.get("/summary", async (req, res) => {
    res.json(toSensorHealthSummaryDto(await sensorHealth.summary(actorOf(req).organisationId)));
  });

  router.get("/devices", async (req, res) => {
    const query = parse(sensorAttentionQuerySchema, req.query, "query");
    const { items, total } = await sensorHealth.needingAttention(actorOf(req).organisationId, query);
    res.json(
      shaped(sensorAttentionPageResponse, {
        items: items.map(toSensorAttentionDto),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }),
    );
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(toSensorHealthDto(await sensorHealth.forSensor(actorOf(req).organisationId, id)));
  });

  return router;
}
