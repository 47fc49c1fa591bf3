import "@testing-library/jest-dom/vitest";
import { cleanup, configure } from "@testing-library/react";
import { afterEach, vi } from "vitest";
import { takeMockMisfits } from "../client/support/api-mock";
// Translated components read their words from the one i18next instance (English unless a test switches).
import "@/lib/i18n/i18n";

// Lazy route modules load through Vite's transform on first use; on a busy 2-core machine that
// can take longer than Testing Library's default 1 s wait, which made a find* call flaky.
configure({ asyncUtilTimeout: 5000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
  // A mocked API reply that does not fit the API contract fails the test, even if the page coped.
  const misfits = takeMockMisfits();
  if (misfits.length > 0) throw new Error(misfits.map((e) => e.message).join("\n\n"));
});
