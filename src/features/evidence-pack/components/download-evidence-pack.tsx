import { evidencePackPath } from "@/lib/contracts/evidence-pack";
import { textLinkClasses } from "@/components/ui/text-link";

interface DownloadEvidencePackProps {
  caseId: number;
  reference: string;
}

/**
 * The case's evidence pack for a complaint or a claim: a plain link, so the browser streams the PDF
 * to disk itself and shows its own progress. Each pack made goes on the timeline with its hash.
 */
export function DownloadEvidencePack({ caseId, reference }: DownloadEvidencePackProps) {
  return (
    <section aria-label="Evidence pack" className="mb-4 flex flex-wrap items-baseline justify-end gap-x-3 text-sm">
      <a className={textLinkClasses} href={evidencePackPath(caseId)} download={`${reference}-evidence-pack.pdf`}>
        Download evidence pack<span className="sr-only"> of {reference} (PDF)</span>
      </a>
      <span className="text-ink-soft">PDF of every record of the case, for staff; its hash goes on the timeline.</span>
    </section>
  );
}
