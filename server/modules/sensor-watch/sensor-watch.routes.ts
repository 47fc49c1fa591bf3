import { Router } from "express";
import { alertsDismissedResponse, homesAtRiskResponse, proactiveCaseResponse } from "../../../src/lib/contracts/sensor-watch.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { toHomeAtRiskDto } from "./sensor-watch.mapper.js";
import { alertListQuery, dismissAlertSchema } from "./sensor-watch.schemas.js";
import type { SensorWatchService } from "./sensor-watch.service.js";

/** `/api/sensor-alerts`: the Alerts view (officers and admins). */
export function createSensorWatchRouter({ sensorWatch }: { sensorWatch: SensorWatchService }): Router {
  const router = Router();
  const officers = requireRole("officer", "admin");
  router.get("/", officers, async (req, res) => {
    const { sort, dir } = parse(alertListQuery, req.query);
    const homes = await sensorWatch.homesAtRisk(actorOf(req), sort, dir);
    res.json(shaped(homesAtRiskResponse, { items: homes.map(toHomeAtRiskDto) }));
  });
  router.post("/:id/proactive-case", officers, async (req, res) => {
    const result = await sensorWatch.openProactiveCase(actorOf(req), parse(idParamsSchema, req.params, "params").id);
    res.status(result.created ? 201 : 200).json(shaped(proactiveCaseResponse, result));
  });
  router.post("/:id/dismiss", officers, async (req, res) => {
    const { reason } = parse(dismissAlertSchema, req.body);
    res.json(
      shaped(
        alertsDismissedResponse,
        await sensorWatch.dismiss(actorOf(req), parse(idParamsSchema, req.params, "params").id, reason),
      ),
    );
  });
  return router;
}
