import { Alert } from "@/components/ui/alert";
import { CollapsibleSection } from "@/components/ui/collapsible-section";
import type { AdviceItemResponse } from "@/lib/contracts/home-advice";
import { useCaseAdvice, type HomeAdvice } from "../api/get-case-advice";
import { adviceText as t, costLabels } from "../text";

interface HomeAdviceSectionProps {
  caseId: number;
  /** Staff see the same list, read-only, so the officer knows what the tenant was told. */
  audience?: "tenant" | "staff";
  /** Open when the page loads (just after the report is sent, or a link to #case-advice); one press away otherwise. */
  open?: boolean;
}

/**
 * The few things most likely to help in this case's home, ranked by the server, with their cautions
 * and sources: behind its heading like the page's other parts, so the case page stays short.
 */
export function HomeAdviceSection({ caseId, audience = "tenant", open = false }: HomeAdviceSectionProps) {
  const advice = useCaseAdvice(caseId);
  const staff = audience === "staff";
  return (
    <CollapsibleSection
      id="case-advice"
      title={staff ? t.staffTitle : t.tenantTitle}
      summary={advice.data ? t.summary(advice.data.items.length) : undefined}
      defaultOpen={open}
    >
      <p className="mb-3">{staff ? t.staffIntro : t.tenantIntro}</p>
      {advice.isPending ? (
        <p role="status">{t.loading}</p>
      ) : advice.isError ? (
        <p>{t.failed}</p>
      ) : (
        <AdviceBody advice={advice.data} />
      )}
    </CollapsibleSection>
  );
}

function AdviceBody({ advice }: { advice: HomeAdvice }) {
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="warning" title={`${t.safetyTitle}: ${advice.safety.title}`} live="none">
        <p>{advice.safety.whatToDo}</p>
        <p className="mt-1">{advice.safety.why}</p>
        <ul className="mt-1 list-disc pl-5">
          {advice.safety.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
        <p className="mt-1 text-sm text-ink-soft">
          {t.sourceLabel} {advice.safety.source}
        </p>
      </Alert>
      {advice.items.length === 0 ? (
        <p>{t.none}</p>
      ) : (
        <ol aria-label={t.listLabel} className="flex flex-col gap-4">
          {advice.items.map((item) => (
            <AdviceEntry key={item.id} item={item} />
          ))}
        </ol>
      )}
      {advice.support ? (
        <section aria-labelledby="case-advice-support" className="rounded-md border border-line p-3">
          <h3 id="case-advice-support" className="font-bold">
            {t.supportTitle}
          </h3>
          <p className="mt-1">{advice.support.text ?? t.supportNeutral}</p>
          {advice.support.phone ? (
            <p className="mt-1">
              {t.supportPhone} <a href={`tel:${advice.support.phone.replace(/[^\d+]/g, "")}`}>{advice.support.phone}</a>
            </p>
          ) : null}
          {advice.support.link ? (
            <p className="mt-1">
              {t.supportLink}{" "}
              <a href={advice.support.link} rel="noopener noreferrer">
                {advice.support.link}
              </a>
            </p>
          ) : null}
        </section>
      ) : null}
      <p className="text-sm text-ink-soft">{t.trades}</p>
    </div>
  );
}

function AdviceEntry({ item }: { item: AdviceItemResponse }) {
  return (
    <li className="rounded-md border border-line p-3">
      <h3 className="font-bold">{item.title}</h3>
      <p className="mt-1">{item.whatToDo}</p>
      <p className="mt-1">
        <strong>{t.whyLabel}</strong> {item.why}
      </p>
      <p className="mt-1">
        <strong>{t.costLabel}</strong> {costLabels[item.cost]}
      </p>
      {item.cautions.length ? (
        <div className="mt-1">
          <strong>{t.cautionsLabel}</strong>
          <ul className="list-disc pl-5">
            {item.cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <p className="mt-1 text-sm text-ink-soft">
        {t.sourceLabel} {item.source}
      </p>
    </li>
  );
}
