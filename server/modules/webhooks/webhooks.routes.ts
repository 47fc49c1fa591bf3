import { Router } from "express";
import {
  webhookDeliveryPageResponse,
  webhookEndpointListResponse,
  webhookSecretResponse,
} from "../../../src/lib/contracts/webhooks.js";
import { webhookEndpointPatchSchema } from "../../../src/lib/schemas/webhooks.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { toWebhookDeliveryDto, toWebhookEndpointDto } from "./webhook.mapper.js";
import type { WebhookService } from "./webhook.service.js";
import {
  webhookDeliveryListQuerySchema,
  webhookDeliveryParamsSchema,
  webhookEndpointCreateSchema,
  webhookIdParamsSchema,
} from "./webhooks.schemas.js";

/** `/api/webhooks`: a landlord's admins register endpoints, rotate their secrets, see each delivery and send one again. */
export function createWebhooksRouter({ webhooks }: { webhooks: WebhookService }): Router {
  const router = Router();
  router.use(requireRole("admin"));

  router.get("/", async (req, res) => {
    const items = await webhooks.list(actorOf(req));
    res.json(shaped(webhookEndpointListResponse, { items: items.map((i) => toWebhookEndpointDto(i.endpoint, i.counts)) }));
  });

  router.post("/", async (req, res) => {
    const input = parse(webhookEndpointCreateSchema, req.body);
    const { endpoint, secret } = await webhooks.create(actorOf(req), input);
    res
      .status(201)
      .json(shaped(webhookSecretResponse, { endpoint: toWebhookEndpointDto(endpoint, { pending: 0, failed: 0 }), secret }));
  });

  router.patch("/:id", async (req, res) => {
    const { id } = parse(webhookIdParamsSchema, req.params, "params");
    const patch = parse(webhookEndpointPatchSchema, req.body);
    const actor = actorOf(req);
    await webhooks.update(actor, id, patch);
    const { endpoint, counts } = await webhooks.get(actor, id);
    res.json(toWebhookEndpointDto(endpoint, counts));
  });

  router.delete("/:id", async (req, res) => {
    const { id } = parse(webhookIdParamsSchema, req.params, "params");
    await webhooks.remove(actorOf(req), id);
    res.status(204).end();
  });

  router.post("/:id/secret", async (req, res) => {
    const { id } = parse(webhookIdParamsSchema, req.params, "params");
    const actor = actorOf(req);
    const { secret } = await webhooks.rotateSecret(actor, id);
    const { endpoint, counts } = await webhooks.get(actor, id);
    res.json(shaped(webhookSecretResponse, { endpoint: toWebhookEndpointDto(endpoint, counts), secret }));
  });

  router.post("/:id/test", async (req, res) => {
    const { id } = parse(webhookIdParamsSchema, req.params, "params");
    res.status(202).json(toWebhookDeliveryDto(await webhooks.sendTest(actorOf(req), id)));
  });

  router.get("/:id/deliveries", async (req, res) => {
    const { id } = parse(webhookIdParamsSchema, req.params, "params");
    const query = parse(webhookDeliveryListQuerySchema, req.query, "query");
    const { items, total } = await webhooks.deliveries(actorOf(req), id, query);
    res.json(
      shaped(webhookDeliveryPageResponse, {
        items: items.map(toWebhookDeliveryDto),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }),
    );
  });

  router.post("/:id/deliveries/:deliveryId/resend", async (req, res) => {
    const { id, deliveryId } = parse(webhookDeliveryParamsSchema, req.params, "params");
    res.status(202).json(toWebhookDeliveryDto(await webhooks.resend(actorOf(req), id, deliveryId)));
  });

  return router;
}
