// Safety cautions and common-practice suggestions shown beside any damp or mould result
// (TRADE.md §6 and §7, in our own words). The suggestions are about the home, never the people in it.
import { useId } from "react";
import { cn } from "@/lib/cn";

interface SafetyCautionsProps {
  /** Heading level of the two headings, so the page outline stays right (2 by default). */
  headingLevel?: 2 | 3;
  className?: string;
}

export function SafetyCautions({ headingLevel = 2, className }: SafetyCautionsProps) {
  const safetyId = useId();
  const helpsId = useId();
  const Heading = headingLevel === 2 ? "h2" : "h3";
  const headingClass = cn("font-bold text-ink", headingLevel === 2 ? "text-xl" : "text-lg");

  return (
    <div className={cn("flex flex-col gap-6", className)}>
      <section aria-labelledby={safetyId} className="rounded-lg border-l-4 border-ember-400 bg-ember-50 p-4 sm:p-5">
        <Heading id={safetyId} className={headingClass}>
          Keeping safe
        </Heading>
        <ul className="mt-2 list-disc space-y-2 pl-5">
          <li>
            <strong>Do not heat a room with an oven or a gas hob</strong>, or with a gas or paraffin heater that has no flue. They
            can give off carbon monoxide, a poisonous gas you cannot see or smell, and they can start a fire.
          </li>
          <li>
            <strong>If you clean mould</strong>, wear rubber gloves, a mask and eye protection, and keep a window open while you
            work and for a while after.
          </li>
          <li>
            <strong>Some people should not clean mould at all:</strong> anyone with asthma, allergies or a weakened immune system,
            anyone who is pregnant, and children. Ask someone else to do it, or ask your landlord.
          </li>
          <li>
            <strong>Bleach is not a fix.</strong> It can fade the marks for a while, but the damp that feeds mould is still there,
            and the mould comes back.
          </li>
          <li>
            <strong>Keep vents clear.</strong> Blocking vents or air bricks to stop draughts traps moist air indoors.
          </li>
          <li>
            <strong>Fans, heaters and boilers are jobs for qualified trades.</strong> Fitting or repairing them is electrical or
            gas work: it needs a qualified electrician or a registered gas engineer, and must follow your local building and
            safety rules.
          </li>
        </ul>
      </section>

      <section aria-labelledby={helpsId}>
        <Heading id={helpsId} className={headingClass}>
          Things that often help a home stay drier
        </Heading>
        <p className="mt-1 text-ink-soft">
          Common practice, not a cure: if damp or mould keeps coming back, the cause needs finding.
        </p>
        <ul className="mt-2 list-disc space-y-2 pl-5">
          <li>Trickle vents in window frames and air bricks in walls work best left open.</li>
          <li>Extractor fans do most good running while cooking or bathing, and for a while afterwards.</li>
          <li>A home kept at a steady, low warmth tends to stay drier than one left unheated.</li>
          <li>Condensation wiped off windows and sills in the morning has less time to soak in.</li>
          <li>
            Mould on a surface that is not cold, or that is damp without condensation, can mean a leak, or damp coming through a
            wall or up from the ground. Finding that is a job for a surveyor.
          </li>
        </ul>
      </section>
    </div>
  );
}

/** Said wherever numbers are shown: the numbers never decide whether damp or mould is worth reporting. */
export function ReportStillMatters({ className }: { className?: string }) {
  return (
    <div className={cn("flex items-start gap-3 rounded-md border-2 border-dew-600 bg-dew-50 px-4 py-3 text-ink", className)}>
      <svg viewBox="0 0 24 24" className="mt-0.5 size-6 shrink-0 text-dew-700" aria-hidden="true" focusable="false">
        <path d="M4 5h16v11H9l-5 4z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
        <path d="M8 9h8M8 12h5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <p>
        <strong>Whatever these numbers say, if you see damp or mould, tell your landlord.</strong> They must look into it and find
        the cause.
      </p>
    </div>
  );
}
