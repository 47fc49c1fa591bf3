import { useState, type FormEvent } from "react";
import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { Input } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useMyTexts, useSaveMyTexts } from "../api/texts";

/** The tenant's own choice: their mobile number and texts on or off. */
export function TextChoiceCard() {
  const { t } = useTranslation("home");
  const current = useMyTexts();
  const save = useSaveMyTexts();
  const [number, setNumber] = useState<string | null>(null);
  const [on, setOn] = useState<boolean | null>(null);
  const shownNumber = number ?? current.data?.mobileNumber ?? "";
  const shownOn = on ?? current.data?.textsOn ?? false;
  const fieldError = (field: string) =>
    save.error instanceof ApiError ? save.error.fieldErrors.find((f) => f.field === field)?.message : undefined;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate({ mobileNumber: shownNumber.trim() || null, textsOn: shownOn });
  };

  return (
    <Panel title={t("texts.title")} id="home-texts">
      {current.isError ? (
        <Alert tone="danger" title={t("texts.loadError")}>
          {errorMessage(current.error)}
        </Alert>
      ) : (
        <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
          <p>{t("texts.intro")}</p>
          <Input
            id="texts-number"
            label={t("texts.number")}
            hint={t("texts.numberHint")}
            type="tel"
            autoComplete="tel"
            inputMode="tel"
            value={shownNumber}
            error={fieldError("mobileNumber")}
            onChange={(e) => setNumber(e.target.value)}
          />
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={shownOn} onChange={(e) => setOn(e.target.checked)} />
            {t("texts.on")}
          </label>
          <div>
            <Button type="submit" disabled={save.isPending || current.isPending}>
              {save.isPending ? t("texts.saving") : t("texts.save")}
            </Button>
          </div>
          {save.isSuccess && <Alert tone="success">{save.data.textsOn ? t("texts.savedOn") : t("texts.savedOff")}</Alert>}
          {save.isError && !fieldError("mobileNumber") && <Alert tone="danger">{errorMessage(save.error)}</Alert>}
        </form>
      )}
    </Panel>
  );
}
