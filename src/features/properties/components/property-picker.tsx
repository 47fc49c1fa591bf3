import { useEffect, useId, useState } from "react";
import { controlClasses, describedBy, FieldShell } from "@/components/ui/field";
import { Spinner } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { streetAddress } from "@/lib/homes";
import { useProperties } from "../api/get-properties";
import { useProperty } from "../api/get-property";

export interface PropertyPickerProps {
  value: number | undefined;
  onChange: (id: number | undefined) => void;
  error?: string;
  label?: string;
}

/**
 * Choose a home: type part of the address or postcode, then pick from the matches. The list is
 * searched on the server, so it works for landlords with many thousands of homes.
 */
export function PropertyPicker({ value, onChange, error, label = "Home" }: PropertyPickerProps) {
  const searchId = useId();
  const selectId = useId();
  const [draft, setDraft] = useState("");
  const [q, setQ] = useState("");

  useEffect(() => {
    const t = setTimeout(() => setQ(draft.trim()), 300);
    return () => clearTimeout(t);
  }, [draft]);

  const matches = useProperties({ q, estate: "", page: 1, pageSize: 20 });
  const chosen = useProperty(value);
  const items = matches.data?.items ?? [];
  const chosenIsListed = value !== undefined && items.some((p) => p.id === value);
  const hint = "Search, then choose the home from the list.";

  return (
    <fieldset className="flex flex-col gap-3 rounded-md border border-line p-3">
      <legend className="px-1 font-semibold">{label}</legend>
      <div className="flex flex-col gap-1">
        <label htmlFor={searchId} className="text-sm font-semibold">
          Find a home
        </label>
        <input
          id={searchId}
          type="search"
          value={draft}
          onChange={(e) => setDraft(e.target.value)}
          placeholder="Street, postcode, UPRN or estate"
          className={cn(controlClasses, "min-h-9 py-1.5 text-sm")}
        />
      </div>
      <FieldShell id={selectId} label="Choose the home" hint={hint} error={error}>
        <div className="flex items-center gap-2">
          <select
            id={selectId}
            value={value ?? ""}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy(selectId, hint, error)}
            onChange={(e) => onChange(e.target.value ? Number(e.target.value) : undefined)}
            className={cn(controlClasses, "min-h-9 py-1.5 text-sm")}
          >
            <option value="">{matches.isPending ? "Loading homes…" : items.length ? "Choose a home" : "No homes match"}</option>
            {value !== undefined && !chosenIsListed && chosen.data ? (
              <option value={value}>
                {streetAddress(chosen.data)}, {chosen.data.postcode}
              </option>
            ) : null}
            {items.map((p) => (
              <option key={p.id} value={p.id}>
                {streetAddress(p)}, {p.postcode} ({p.estate})
              </option>
            ))}
          </select>
          {matches.isFetching ? <Spinner size="sm" label="Searching homes" /> : null}
        </div>
      </FieldShell>
      {matches.data && matches.data.total > items.length ? (
        <p className="text-xs text-ink-soft">
          Showing the first {items.length} of {matches.data.total} matches: type more of the address to narrow the list.
        </p>
      ) : null}
      {matches.isError ? <p className="text-sm font-semibold text-rust-700">{errorMessage(matches.error)}</p> : null}
    </fieldset>
  );
}
