import { Router } from "express";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { toPropertyDto } from "../properties/property.mapper.js";
import type { TenancyService } from "./tenancy.service.js";

/** The tenant's own home: `GET /api/me/home`. */
export function createMyHomeRouter({ tenancies }: { tenancies: TenancyService }): Router {
  const router = Router();
  router.get("/home", requireRole("tenant"), async (req, res) => {
    const { tenancy, property } = await tenancies.homeOf(actorOf(req));
    res.json({
      tenancy: { id: tenancy.id, startDate: tenancy.startDate, endDate: tenancy.endDate },
      property: toPropertyDto(property),
    });
  });
  return router;
}
