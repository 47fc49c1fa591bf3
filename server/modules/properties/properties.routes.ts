import { Router } from "express";
import { estatesResponse, propertyPageResponse } from "../../../src/lib/contracts/properties.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema, propertyListQuerySchema } from "./properties.schemas.js";
import { toPropertyDto, toPropertySummaryDto } from "./property.mapper.js";
import type { PropertyService } from "./property.service.js";

export function createPropertiesRouter({ properties }: { properties: PropertyService }): Router {
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

  return router;
}
