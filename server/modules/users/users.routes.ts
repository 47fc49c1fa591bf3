import { Router } from "express";
import { myLanguageResponse } from "../../../src/lib/contracts/auth.js";
import { myLanguageSchema } from "../../../src/lib/schemas/language.js";
import { staffListResponse, userHistoryResponse, userPageResponse } from "../../../src/lib/contracts/users.js";
import { USER_EXPORT_COLUMNS } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import type { Clock } from "../../lib/clock.js";
import { EXPORT_PAGE_SIZE, keysetPages, newPageTimes, sendTableExport } from "../../lib/table-export.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toStaffMemberDto, toUserAuditDto, toUserDto } from "./user.mapper.js";
import type { UserService } from "./user.service.js";
import { userExportQuerySchema, userListQuerySchema, userUpdateSchema } from "./users.schemas.js";

export function createUsersRouter({ users, clock }: { users: UserService; clock: Clock }): Router {
  const router = Router();
  router.use(requireRole("admin"));

  router.get("/", async (req, res) => {
    const query = parse(userListQuerySchema, req.query, "query");
    const { items, total } = await users.list(actorOf(req), query);
    res.json(shaped(userPageResponse, { items: items.map(toUserDto), total, page: query.page, pageSize: query.pageSize }));
  });

  // The accounts list with its filters, every page of it, as CSV or .xlsx.
  router.get("/export", async (req, res) => {
    const { format, ...query } = parse(userExportQuerySchema, req.query, "query");
    const actor = actorOf(req);
    const times = newPageTimes();
    await sendTableExport(res, {
      format,
      view: "accounts",
      now: clock.now(),
      columns: USER_EXPORT_COLUMNS,
      times,
      pages: keysetPages(
        async (after, limit) => {
          const { rows, last } = await users.listAfter(actor, query, after, limit);
          return { rows: rows.map(toUserDto), last };
        },
        EXPORT_PAGE_SIZE,
        times,
      ),
    });
  });

  router.patch("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const input = parse(userUpdateSchema, req.body);
    res.json(toUserDto(await users.update(actorOf(req), id, input)));
  });

  router.get("/:id/history", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const entries = await users.history(actorOf(req), id);
    res.json(shaped(userHistoryResponse, { entries: entries.map(toUserAuditDto) }));
  });

  return router;
}

/** `GET /api/staff`: the landlord's active staff, the people a case can be assigned to (any staff role). */
export function createStaffRouter({ users }: { users: UserService }): Router {
  const router = Router();
  router.get("/", requireStaff, async (req, res) => {
    const staff = await users.activeStaff(actorOf(req));
    res.json(shaped(staffListResponse, { users: staff.map(toStaffMemberDto) }));
  });
  return router;
}

/** PUT /api/me/language: a tenant's own language (staff screens stay English: 403). */
export function createMyLanguageRouter({ users }: { users: UserService }): Router {
  const router = Router();
  router.put("/language", requireRole("tenant"), async (req, res) => {
    const { language } = parse(myLanguageSchema, req.body);
    res.json(shaped(myLanguageResponse, { language: await users.setOwnLanguage(actorOf(req), language) }));
  });
  return router;
}
