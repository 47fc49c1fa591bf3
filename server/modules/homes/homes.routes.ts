import { Router } from "express";
import { homeCasesResponse, homeReadingsResponse, homeTenantsResponse } from "../../../src/lib/contracts/properties.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toRoomDto } from "../properties/property.mapper.js";
import type { HomeRecordService } from "./home-record.service.js";

/** A home's tenants, cases and readings for its page (mounted at /api/properties, staff only). */
export function createHomeRecordRouter({ homes }: { homes: HomeRecordService }): Router {
  const router = Router();
  router.use(requireStaff);

  router.get("/:id/tenants", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const rows = await homes.tenants(actorOf(req), id);
    res.json(
      shaped(homeTenantsResponse, {
        tenants: rows.map(({ tenancy, person }) => ({
          tenancyId: tenancy.id,
          userId: person.id,
          name: person.name,
          email: person.email,
          startDate: tenancy.startDate,
          endDate: tenancy.endDate,
          current: tenancy.current,
          language: person.language,
        })),
      }),
    );
  });

  router.get("/:id/cases", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const rows = await homes.casesOf(actorOf(req), id);
    res.json(
      shaped(homeCasesResponse, {
        cases: rows.map(({ case: c, tenantName }) => ({
          id: c.id,
          reference: c.reference,
          status: c.status,
          channel: c.channel,
          awareAt: c.awareAt.toISOString(),
          description: c.description,
          tenantName,
        })),
      }),
    );
  });

  router.get("/:id/readings", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const rooms = await homes.readingsOf(actorOf(req), id);
    res.json(
      shaped(homeReadingsResponse, {
        rooms: rooms.map((r) => ({
          room: toRoomDto(r.room),
          count: r.count,
          latest: r.latest.map((x) => ({ ...x, takenAt: x.takenAt.toISOString() })),
        })),
      }),
    );
  });

  return router;
}
