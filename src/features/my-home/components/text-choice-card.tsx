import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { Input } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useMyTexts, useSaveMyTexts } from "../api/texts";

/** Every word of the card, in one place (so it can be translated later). */
const WORDS = {
  title: "Texts about your reports",
  intro:
    "We can send you a text when we offer a visit, the day before a visit, when we send you a message, and when we send you a written summary. Texts are off until you turn them on.",
  number: "Your mobile number",
  numberHint: "A UK mobile number, like 07700 900123.",
  on: "Send me texts",
  save: "Save",
  saving: "Saving…",
  savedOn: "Saved. We will text you.",
  savedOff: "Saved. We will not text you. You will still get e-mails.",
  loadError: "We could not load your text settings",
};

/** The tenant's own choice: their mobile number and texts on or off. */
export function TextChoiceCard() {
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
    <Panel title={WORDS.title} id="home-texts">
      {current.isError ? (
        <Alert tone="danger" title={WORDS.loadError}>
          {errorMessage(current.error)}
        </Alert>
      ) : (
        <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
          <p>{WORDS.intro}</p>
          <Input
            id="texts-number"
            label={WORDS.number}
            hint={WORDS.numberHint}
            type="tel"
            autoComplete="tel"
            inputMode="tel"
            value={shownNumber}
            error={fieldError("mobileNumber")}
            onChange={(e) => setNumber(e.target.value)}
          />
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={shownOn} onChange={(e) => setOn(e.target.checked)} />
            {WORDS.on}
          </label>
          <div>
            <Button type="submit" disabled={save.isPending || current.isPending}>
              {save.isPending ? WORDS.saving : WORDS.save}
            </Button>
          </div>
          {save.isSuccess && <Alert tone="success">{save.data.textsOn ? WORDS.savedOn : WORDS.savedOff}</Alert>}
          {save.isError && !fieldError("mobileNumber") && <Alert tone="danger">{errorMessage(save.error)}</Alert>}
        </form>
      )}
    </Panel>
  );
}
