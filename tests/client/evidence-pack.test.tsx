import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { describeEvent } from "@/features/cases/components/case-timeline";
import { DownloadEvidencePack } from "@/features/evidence-pack/components/download-evidence-pack";

describe("the evidence pack on the staff case page", () => {
  it("is a download link to the case's pack, named after the case", () => {
    render(<DownloadEvidencePack caseId={42} reference="DW-2026-00042" />);
    const link = screen.getByRole("link", { name: "Download evidence pack of DW-2026-00042 (PDF)" });
    expect(link).toHaveAttribute("href", "/api/cases/42/evidence-pack");
    expect(link).toHaveAttribute("download", "DW-2026-00042-evidence-pack.pdf");
  });

  it("says on the staff timeline who made a pack, its pages and its hash", () => {
    const sha256 = "a".repeat(64);
    const { title, detail } = describeEvent(
      {
        id: 9,
        type: "evidence-pack-made",
        at: "2026-01-12T09:00:00.000Z",
        actor: { name: "Priya Venn", role: "officer" },
        before: null,
        after: { sha256, pages: 12, fileName: "DW-2026-00042-evidence-pack.pdf" },
        email: null,
      },
      [],
      "staff",
    );
    expect(title).toBe("Priya Venn (Housing officer) made the evidence pack (12 pages).");
    render(<>{detail}</>);
    expect(screen.getByText(`Content SHA-256 ${sha256}`)).toBeInTheDocument();
  });
});
