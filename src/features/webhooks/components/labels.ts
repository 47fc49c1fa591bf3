import type { WebhookDeliveryStatus, WebhookEventType } from "@/lib/contracts";

export const webhookEventLabels: Record<WebhookEventType | "webhook.test", string> = {
  "case.created": "A case is reported",
  "case.status-changed": "A case's status changes",
  "case.deadline-missed": "A case's deadline passes undone",
  "work-order.booked": "A work order is booked",
  "work-order.completed": "A work order is completed",
  "webhook.test": "Test event",
};

export const deliveryStatusLabels: Record<WebhookDeliveryStatus, string> = {
  pending: "Waiting",
  sending: "Being sent",
  delivered: "Delivered",
  failed: "Given up",
};
