import { Router } from "express";
import { z } from "zod";
import { boardReportSettingsResponse, boardReportSentResponse } from "../../../src/lib/contracts/board-report.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { monthSchema, PDF_MEDIA_TYPE, type BoardReportService } from "./board-report.service.js";

const monthQuery = z.object({ month: monthSchema });
const recipientsBody = z.object({ recipients: z.array(z.string().max(300)).max(200) });

/** Mounted at /api/board-report: the month's PDF (staff but operatives), and the admin's list and sending. */
export function createBoardReportRouter({ reports }: { reports: BoardReportService }): Router {
  const router = Router();
  const staff = requireRole("officer", "maintenance", "admin");
  const admin = requireRole("admin");

  router.get("/", staff, async (req, res) => {
    const { month } = parse(monthQuery, req.query, "query");
    // Every figure is read before the first byte: a refusal or a failure is still an ordinary reply.
    const report = await reports.prepare(actorOf(req), month);
    res.type(PDF_MEDIA_TYPE);
    res.attachment(report.fileName);
    res.setHeader("Cache-Control", "no-store");
    try {
      await report.write(res);
    } catch (err) {
      req.log?.error({ err, month }, "the board report failed while it was being written");
      res.destroy(err instanceof Error ? err : new Error(String(err)));
    }
  });

  router.get("/settings", admin, async (req, res) => {
    const s = await reports.recipients(actorOf(req));
    res.json(
      shaped(boardReportSettingsResponse, {
        recipients: s.recipients,
        lastSent: s.lastSent ? { month: s.lastSent.month, sentAt: s.lastSent.sentAt.toISOString() } : null,
      }),
    );
  });

  router.put("/settings", admin, async (req, res) => {
    const { recipients } = parse(recipientsBody, req.body);
    const saved = await reports.setRecipients(actorOf(req), recipients);
    const s = await reports.recipients(actorOf(req));
    res.json(
      shaped(boardReportSettingsResponse, {
        recipients: saved,
        lastSent: s.lastSent ? { month: s.lastSent.month, sentAt: s.lastSent.sentAt.toISOString() } : null,
      }),
    );
  });

  router.post("/send", admin, async (req, res) => {
    const { month } = parse(monthQuery, req.body);
    const emails = await reports.send(actorOf(req), month);
    res.json(shaped(boardReportSentResponse, { month, emails }));
  });

  return router;
}
