import { Router } from "express";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toUserDto } from "./user.mapper.js";
import type { UserService } from "./user.service.js";
import { userListQuerySchema, userUpdateSchema } from "./users.schemas.js";

export function createUsersRouter({ users }: { users: UserService }): Router {
  const router = Router();
  router.use(requireRole("admin"));

  router.get("/", async (req, res) => {
    const query = parse(userListQuerySchema, req.query, "query");
    const { items, total } = await users.list(actorOf(req), query);
    res.json({ items: items.map(toUserDto), total, page: query.page, pageSize: query.pageSize });
  });

  router.patch("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { status } = parse(userUpdateSchema, req.body);
    res.json(toUserDto(await users.setStatus(actorOf(req), id, status)));
  });

  return router;
}
