import { useEffect, useState } from "react";
import { WaitingOnThisDevice } from "@/features/report/components/waiting-on-this-device";
import type { WaitingWords } from "@/features/report/lib/waiting-words";
import { deviceLanguage } from "@/lib/i18n/choice";
import { DEFAULT_LNG } from "@/lib/i18n/languages";

/**
 * The "waiting to send" note on the page shown when the session could not be checked (no signal).
 * Who is signed in is not known there, so the language is this device's; only when it is not English
 * is the tenant's shell loaded for the words (English needs no i18next, and staff never choose another).
 */
export function WaitingNote() {
  const [words, setWords] = useState<WaitingWords>();
  useEffect(() => {
    const lng = deviceLanguage();
    if (lng === DEFAULT_LNG) return;
    let live = true;
    void import("./routes/app/tenant-root")
      .then((m) => m.waitingWords(lng))
      .then(
        (w) => live && setWords(w),
        // The words could not load (no signal and not cached): the English note still says what matters.
        () => undefined,
      );
    return () => {
      live = false;
    };
  }, []);
  return <WaitingOnThisDevice words={words} />;
}
