// The case evidence pack (GET /api/cases/:id/evidence-pack): a PDF for staff, and the timeline entry
// recording each one made.
import { z } from "zod";

export const EVIDENCE_PACK_MEDIA_TYPE = "application/pdf";

/** Where a case's pack is downloaded (a plain link: the browser sends the session cookie). */
export const evidencePackPath = (caseId: number) => `/api/cases/${caseId}/evidence-pack`;

/**
 * What the hash printed on every page is. Written into every pack ("About this pack") and
 * into DEVELOPERS.md; a pack says which definition it follows in its facts (`definition`).
 */
export const EVIDENCE_PACK_DEFINITION = {
  id: "dewline-evidence-pack/1",
  text: [
    "The hash is the SHA-256 of the file facts.json attached to this PDF: every fact the pack states " +
      "(the home, the report, the photos, the readings, the evaluation, the assessments, inspections, " +
      "letters, messages, e-mails, deadlines, works, verification and timeline), written as JSON with " +
      "every object's keys sorted, no spaces, and times in UTC (the key order and number form of RFC 8785).",
    "Each photo is listed in facts.json with the SHA-256 of its bytes, and the same bytes are the image " +
      "embedded in this PDF, so a changed photo changes its listed hash, and so the pack's hash.",
    "To check a pack: extract facts.json (for example `pdfdetach -saveall`) and compute its SHA-256; " +
      "extract the photos as they are stored (`pdfimages -all`) and compare each one's SHA-256 with facts.json.",
    "When the pack was made and by whom are printed on its first page and recorded on the case's " +
      "timeline; they are not part of the hashed facts.",
  ],
} as const;

/** The `after` of a timeline entry of type "evidence-pack-made". */
export const evidencePackMadeEvent = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  pages: z.number().int().positive(),
  fileName: z.string(),
});
export type EvidencePackMadeEvent = z.infer<typeof evidencePackMadeEvent>;
