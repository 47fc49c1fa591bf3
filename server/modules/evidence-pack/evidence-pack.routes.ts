import { Router } from "express";
import { EVIDENCE_PACK_MEDIA_TYPE } from "../../../src/lib/contracts/evidence-pack.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { EvidencePackService } from "./evidence-pack.service.js";

/** Mounted at /api/cases: `GET /:id/evidence-pack`, the case's evidence pack as a PDF (officers, leads, admins). */
export function createEvidencePackRouter({ packs }: { packs: EvidencePackService }): Router {
  const router = Router();
  router.get("/:id/evidence-pack", requireRole("officer", "maintenance", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    // Access and every fact are read before the first byte: a refusal is still an ordinary reply.
    const pack = await packs.prepare(actorOf(req), id);
    res.type(EVIDENCE_PACK_MEDIA_TYPE);
    res.attachment(pack.fileName);
    res.setHeader("Cache-Control", "no-store");
    res.setHeader("X-Content-SHA256", pack.sha256);
    try {
      await pack.write(res);
    } catch (err) {
      // Part of the file may have gone: end the connection so the download is seen to be incomplete.
      req.log?.error({ err, caseId: id }, "the evidence pack failed while it was being written");
      res.destroy(err instanceof Error ? err : new Error(String(err)));
    }
  });
  return router;
}
