import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import type { RoomOption } from "../api/types";
import { markLoggerFileDone, sendPhotos, sendReadings, useFollowUp } from "../lib/follow-up";
import { RefusedList } from "./photo-picker";
import { CsvImport } from "./csv-import";

interface ReportFollowUpProps {
  caseId: number;
  rooms: readonly RoomOption[];
  /** Something was added: the page refreshes photos, readings and the evaluation. */
  onChanged?: () => void;
}

/**
 * On the case page straight after sending: a retry for photos or readings that did not go up,
 * and the column check for a logger file chosen in the form. Nothing shows once all is done.
 */
export function ReportFollowUp({ caseId, rooms, onChanged }: ReportFollowUpProps) {
  const followUp = useFollowUp(caseId);
  // The import's result stays in view on this visit; on a later visit the finished check is gone.
  const [importedHere, setImportedHere] = useState(false);
  if (!followUp) return null;
  const { photos, readings, loggerFile } = followUp;

  const retryPhotos = async () => {
    if (await sendPhotos(caseId)) onChanged?.();
  };
  const retryReadings = async () => {
    if (await sendReadings(caseId)) onChanged?.();
  };

  return (
    <div className="flex flex-col gap-4">
      {photos && photos.status !== "done" ? (
        <Alert
          tone={photos.status === "failed" ? "danger" : "info"}
          title={photos.status === "failed" ? "Your report is sent, but the photos didn't upload" : "Adding your photos…"}
        >
          {photos.status === "failed" ? (
            <div className="flex flex-col items-start gap-2">
              <p>{photos.error}</p>
              <p>
                Your report is safe. You can try the {photos.files.length === 1 ? "photo" : `${photos.files.length} photos`} again
                now, or add photos later.
              </p>
              <Button size="sm" onClick={() => void retryPhotos()}>
                Try the photos again
              </Button>
            </div>
          ) : null}
        </Alert>
      ) : null}

      {photos && photos.status === "done" && photos.refused?.length ? (
        <Alert
          tone="warning"
          title={
            photos.added
              ? `Your report is sent with ${photos.added === 1 ? "1 photo" : `${photos.added} photos`}, but ${photos.refused.length === 1 ? "one file" : `${photos.refused.length} files`} could not be added`
              : `Your report is sent, but the ${photos.refused.length === 1 ? "photo" : "photos"} could not be added`
          }
        >
          <RefusedList files={photos.refused} />
          <p className="mt-2">You can add other photos from this page at any time.</p>
        </Alert>
      ) : null}

      {readings && readings.status !== "done" ? (
        <Alert
          tone={readings.status === "failed" ? "danger" : "info"}
          title={readings.status === "failed" ? "Your report is sent, but the readings weren't added" : "Adding your readings…"}
        >
          {readings.status === "failed" ? (
            <div className="flex flex-col items-start gap-2">
              <p>{readings.error}</p>
              <p>
                Your report is safe. You can try the{" "}
                {readings.items.length === 1 ? "reading" : `${readings.items.length} readings`} again now.
              </p>
              <Button size="sm" onClick={() => void retryReadings()}>
                Try the readings again
              </Button>
            </div>
          ) : null}
        </Alert>
      ) : null}

      {loggerFile && (loggerFile.status === "waiting" || importedHere) ? (
        <Panel title="Check your logger file" id="logger-file-check">
          <p className="mb-3">
            Your report is sent. Before the readings from {loggerFile.file.name} are added, please check which column is which.
          </p>
          <CsvImport
            caseId={caseId}
            rooms={rooms}
            initialFile={loggerFile.file}
            initialRoomId={loggerFile.roomId}
            onImported={() => {
              setImportedHere(true);
              markLoggerFileDone(caseId);
              onChanged?.();
            }}
          />
        </Panel>
      ) : null}
    </div>
  );
}
