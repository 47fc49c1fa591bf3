import { Alert } from "@/components/ui/alert";
import { CollapsibleSection } from "@/components/ui/collapsible-section";
import type { AdviceItemResponse } from "@/lib/contracts/home-advice";
import type { TFunction } from "i18next";
import { useTranslation } from "react-i18next";
import { i18n as i18next } from "@/lib/i18n/i18n";
import { useCaseAdvice, type HomeAdvice } from "../api/get-case-advice";

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
  const { t } = useTranslation("advice", { i18n: i18next });
  const advice = useCaseAdvice(caseId);
  const staff = audience === "staff";
  return (
    <CollapsibleSection
      id="case-advice"
      title={staff ? t("staffTitle") : t("tenantTitle")}
      summary={advice.data ? t("summary", { count: advice.data.items.length }) : undefined}
      defaultOpen={open}
    >
      <p className="mb-3">{staff ? t("staffIntro") : t("tenantIntro")}</p>
      {advice.isPending ? (
        <p role="status">{t("loading")}</p>
      ) : advice.isError ? (
        <p>{t("failed")}</p>
      ) : (
        <AdviceBody advice={advice.data} />
      )}
    </CollapsibleSection>
  );
}

/**
 * An item's words in the current language: the server sends which item and the home's facts it
 * depends on; the wording (and its ICU selects on those facts) is ours, in src/locales/<lng>/advice.json.
 */
function itemWords(t: TFunction<"advice">, item: AdviceItemResponse) {
  const { walls, glass, ...facts } = item.facts;
  const cold = [walls && walls !== "none" ? t(`walls.${walls}`) : null, glass === "single" ? t("glass.single") : null].filter(
    (part): part is string => part !== null,
  );
  const values = {
    ...facts,
    walls: walls && walls !== "none" ? t(`walls.${walls}`) : "",
    cold: cold.length ? "some" : "none",
    // At most two parts (walls, glass). Our own join: Intl's Welsh list reads "a(c)", leaving the mutation to the reader.
    coldParts: cold.length === 2 ? t("bothCold", { first: cold[0], second: cold[1] }) : (cold[0] ?? ""),
    heating: facts.heating ?? "other",
    fan: facts.fan ?? "other",
    readings: facts.readings ?? "other",
    costs: facts.costs ?? "ok",
  };
  return {
    title: t(`items.${item.id}.title`),
    whatToDo: t(`items.${item.id}.whatToDo`, values),
    why: t(`items.${item.id}.why`, values),
    cautions: item.cautions.map((c) => ({ id: c, text: t(`cautions.${c}`) })),
    source: t(`sources.${item.source}`),
  };
}

function AdviceBody({ advice }: { advice: HomeAdvice }) {
  const { t } = useTranslation("advice", { i18n: i18next });
  const safety = itemWords(t, advice.safety);
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="warning" title={t("safetyTitle", { title: safety.title })} live="none">
        <p>{safety.whatToDo}</p>
        <p className="mt-1">{safety.why}</p>
        <ul className="mt-1 list-disc pl-5">
          {safety.cautions.map((c) => (
            <li key={c.id}>{c.text}</li>
          ))}
        </ul>
        <p className="mt-1 text-sm text-ink-soft">
          {t("sourceLabel")} {safety.source}
        </p>
      </Alert>
      {advice.items.length === 0 ? (
        <p>{t("none")}</p>
      ) : (
        <ol aria-label={t("listLabel")} className="flex flex-col gap-4">
          {advice.items.map((item) => (
            <AdviceEntry key={item.id} item={item} />
          ))}
        </ol>
      )}
      {advice.support ? (
        <section aria-labelledby="case-advice-support" className="rounded-md border border-line p-3">
          <h3 id="case-advice-support" className="font-bold">
            {t("supportTitle")}
          </h3>
          {advice.support.text ? (
            <p className="mt-1" translate="no">
              {advice.support.text}
            </p>
          ) : (
            <p className="mt-1">{t("supportNeutral")}</p>
          )}
          {advice.support.phone ? (
            <p className="mt-1">
              {t("supportPhone")}{" "}
              <a translate="no" href={`tel:${advice.support.phone.replace(/[^\d+]/g, "")}`}>
                {advice.support.phone}
              </a>
            </p>
          ) : null}
          {advice.support.link ? (
            <p className="mt-1">
              {t("supportLink")}{" "}
              <a translate="no" href={advice.support.link} rel="noopener noreferrer">
                {advice.support.link}
              </a>
            </p>
          ) : null}
        </section>
      ) : null}
      <p className="text-sm text-ink-soft">{t("trades")}</p>
    </div>
  );
}

function AdviceEntry({ item }: { item: AdviceItemResponse }) {
  const { t } = useTranslation("advice", { i18n: i18next });
  const words = itemWords(t, item);
  return (
    <li className="rounded-md border border-line p-3">
      <h3 className="font-bold">{words.title}</h3>
      <p className="mt-1">{words.whatToDo}</p>
      <p className="mt-1">
        <strong>{t("whyLabel")}</strong> {words.why}
      </p>
      <p className="mt-1">
        <strong>{t("costLabel")}</strong> {t(`cost.${item.cost}`)}
      </p>
      {words.cautions.length ? (
        <div className="mt-1">
          <strong>{t("cautionsLabel")}</strong>
          <ul className="list-disc pl-5">
            {words.cautions.map((c) => (
              <li key={c.id}>{c.text}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <p className="mt-1 text-sm text-ink-soft">
        {t("sourceLabel")} {words.source}
      </p>
    </li>
  );
}
