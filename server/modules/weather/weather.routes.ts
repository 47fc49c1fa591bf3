import { Router } from "express";
import { estateLocationListResponse, estateLocationResponse } from "../../../src/lib/contracts/weather.js";
import { estateLocationSchema } from "../../../src/lib/schemas/locations.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import type { EstateLocationView, WeatherService } from "./weather.service.js";

const toDto = (l: EstateLocationView) => ({ ...l, updatedAt: l.updatedAt?.toISOString() ?? null });

/** `/api/estate-locations`: staff read where their landlord's estates are; admins set it. */
export function createEstateLocationsRouter({ weather }: { weather: WeatherService }): Router {
  const router = Router();
  router.get("/", requireStaff, async (req, res) => {
    const items = await weather.estateLocations(actorOf(req));
    res.json(shaped(estateLocationListResponse, { items: items.map(toDto) }));
  });
  router.put("/", requireRole("admin"), async (req, res) => {
    const input = parse(estateLocationSchema, req.body);
    res.json(shaped(estateLocationResponse, toDto(await weather.setEstateLocation(actorOf(req), input))));
  });
  return router;
}
