import { useId } from "react";
import { errorMessage } from "@/lib/api-client";
import { useAddReadings } from "../api/add-readings";
import type { ImportResult, ReadingsAdded, RoomOption } from "../api/types";
import { CsvImport } from "./csv-import";
import { HandReadingForm } from "./hand-reading-form";

interface AddReadingsProps {
  caseId: number;
  rooms: readonly RoomOption[];
  /** After readings were added: the page refreshes the readings and what they show. */
  onAdded?: (result: ReadingsAdded | ImportResult) => void;
  headingLevel?: 2 | 3;
}

const tags = { 2: "h2", 3: "h3", 4: "h4" } as const;

/** Readings for a report that has been sent: by hand or from a logger file, as in the report form. */
export function AddReadings({ caseId, rooms, onAdded, headingLevel = 3 }: AddReadingsProps) {
  const id = useId();
  const add = useAddReadings(caseId);
  const Heading = tags[headingLevel];
  const inner = (headingLevel + 1) as 3 | 4;

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby={`${id}-hand`} className="flex flex-col gap-3">
        <Heading id={`${id}-hand`} className="text-lg font-bold">
          A reading by hand
        </Heading>
        <HandReadingForm
          rooms={rooms}
          headingLevel={inner}
          busy={add.isPending}
          error={add.isError ? errorMessage(add.error) : null}
          onAdd={async (reading) => {
            try {
              const result = await add.mutateAsync([reading]);
              onAdded?.(result);
              return true;
            } catch {
              return false;
            }
          }}
        />
      </section>
      <section aria-labelledby={`${id}-file`} className="flex flex-col gap-3">
        <Heading id={`${id}-file`} className="text-lg font-bold">
          Readings from a logger
        </Heading>
        <CsvImport caseId={caseId} rooms={rooms} onImported={onAdded} headingLevel={inner} />
      </section>
    </div>
  );
}
