import { Router } from "express";
import {
  adminActionListResponse,
  apiKeyAuditResponse,
  apiKeyCreatedResponse,
  apiKeyListResponse,
  apiKeyResponse,
} from "../../../src/lib/contracts/integrations.js";
import { apiKeyCreateSchema } from "../../../src/lib/schemas/api-keys.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { AdminActionService } from "./admin-action.service.js";
import { toAdminActionDto, toApiKeyAuditDto, toApiKeyCreatedDto, toApiKeyDto } from "./api-key.mapper.js";
import type { ApiKeyService } from "./api-key.service.js";
import { adminActionListQuerySchema, keyParamsSchema } from "./integrations.schemas.js";

/** `/api/integrations/api-keys`: an admin's keys for their landlord, and the writes made with them. */
export function createApiKeysRouter({ keys }: { keys: ApiKeyService }): Router {
  const router = Router();
  router.use(requireRole("admin"));

  router.get("/", async (req, res) => {
    const { keys: items, people } = await keys.list(actorOf(req));
    res.json(shaped(apiKeyListResponse, { keys: items.map((k) => toApiKeyDto(k, people)) }));
  });

  router.post("/", async (req, res) => {
    const input = parse(apiKeyCreateSchema, req.body);
    const actor = actorOf(req);
    const { key, secret } = await keys.create(actor, input);
    res
      .status(201)
      .set("Cache-Control", "no-store")
      .json(shaped(apiKeyCreatedResponse, toApiKeyCreatedDto(key, actor, secret)));
  });

  router.get("/audit", async (req, res) => {
    const { entries, names } = await keys.audit(actorOf(req));
    res.json(shaped(apiKeyAuditResponse, { entries: entries.map((e) => toApiKeyAuditDto(e, names)) }));
  });

  router.post("/:keyId/revoke", async (req, res) => {
    const { keyId } = parse(keyParamsSchema, req.params, "params");
    const { key, people } = await keys.revoke(actorOf(req), keyId);
    res.json(shaped(apiKeyResponse, toApiKeyDto(key, people)));
  });

  return router;
}

/** `/api/integrations/admin-actions`: what the landlord's admins changed in its keys and webhook endpoints. */
export function createAdminActionsRouter({ adminActions }: { adminActions: AdminActionService }): Router {
  const router = Router();
  router.use(requireRole("admin"));

  router.get("/", async (req, res) => {
    const { subject } = parse(adminActionListQuerySchema, req.query, "query");
    const { entries, people } = await adminActions.list(actorOf(req), subject);
    res.json(shaped(adminActionListResponse, { entries: entries.map((e) => toAdminActionDto(e, people)) }));
  });

  return router;
}
