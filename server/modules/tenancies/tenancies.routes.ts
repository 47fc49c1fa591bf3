import { Router } from "express";
import { myHomeResponse } from "../../../src/lib/contracts/properties.js";
import { shaped } from "../../lib/contract.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { toPropertyDto } from "../properties/property.mapper.js";
import type { TenancyService } from "./tenancy.service.js";

/** The tenant's own home: `GET /api/me/home`. */
export function createMyHomeRouter({ tenancies }: { tenancies: TenancyService }): Router {
  const router = Router();
  router.get("/home", requireRole("tenant"), async (req, res) => {
    const { tenancy, property } = await tenancies.homeOf(actorOf(req));
    res.json(
      shaped(myHomeResponse, {
        tenancy: { id: tenancy.id, startDate: tenancy.startDate, endDate: tenancy.endDate },
        property: toPropertyDto(property),
      }),
    );
  });
  return router;
}
