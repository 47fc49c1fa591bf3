import { useState, type ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { errorMessage } from "@/lib/api-client";
import { useUploadPhotos } from "../api/upload-photos";
import { refusedFromError } from "../lib/photo-files";
import { PhotoPicker, RefusedList } from "./photo-picker";

/** What PhotoUploadForm needs of an upload mutation (TanStack Query's useMutation result fits). */
export interface PhotoUploadMutation {
  mutate(
    files: File[],
    options: { onSuccess: (result: { photos: unknown[]; refused?: readonly { name: string; reason: string }[] }) => void },
  ): void;
  reset(): void;
  isPending: boolean;
  isError: boolean;
  error: unknown;
}

interface PhotoUploadFormProps {
  upload: PhotoUploadMutation;
  /** The button's words for one or several photos. */
  sendLabel: (count: number) => string;
  /** The success notice's title, and an optional line under it. */
  addedTitle: (count: number) => string;
  addedText?: ReactNode;
  hint?: string;
  buttonVariant?: "primary" | "secondary";
  onAdded?: (count: number) => void;
}

/** Choose photos with the report form's picker and send them with the given upload: one form for every place that adds photos. */
export function PhotoUploadForm({
  upload,
  sendLabel,
  addedTitle,
  addedText,
  hint,
  buttonVariant,
  onAdded,
}: PhotoUploadFormProps) {
  const [files, setFiles] = useState<File[]>([]);
  const [added, setAdded] = useState<number | null>(null);
  const [refused, setRefused] = useState<{ name: string; message: string }[]>([]);
  const refusedByServer = upload.isError ? refusedFromError(upload.error) : [];
  return (
    <div className="flex flex-col gap-3">
      <PhotoPicker
        value={files}
        onChange={(next) => {
          setFiles(next);
          setAdded(null);
          setRefused([]);
          upload.reset();
        }}
        serverError={upload.isError && refusedByServer.length === 0 ? errorMessage(upload.error) : null}
        disabled={upload.isPending}
        hint={hint}
      />
      {refusedByServer.length || refused.length ? (
        <Alert
          tone="warning"
          title={
            refusedByServer.length
              ? "None of these files could be added"
              : refused.length === 1
                ? "One file could not be added"
                : `${refused.length} files could not be added`
          }
        >
          <RefusedList files={refusedByServer.length ? refusedByServer : refused} />
        </Alert>
      ) : null}
      {added !== null && added > 0 ? (
        <Alert tone="success" title={addedTitle(added)}>
          {addedText}
        </Alert>
      ) : null}
      <div>
        <Button
          variant={buttonVariant}
          disabled={files.length === 0}
          busy={upload.isPending}
          onClick={() =>
            upload.mutate(files, {
              onSuccess: (result) => {
                setFiles([]);
                setAdded(result.photos.length);
                setRefused((result.refused ?? []).map((r) => ({ name: r.name, message: r.reason })));
                onAdded?.(result.photos.length);
              },
            })
          }
        >
          {sendLabel(files.length)}
        </Button>
      </div>
    </div>
  );
}

interface AddPhotosProps {
  caseId: number;
  /** After photos were added: the page refreshes what it shows. */
  onAdded?: (count: number) => void;
}

/** More photos for a report that has been sent: the same picker as the report form. */
export function AddPhotos({ caseId, onAdded }: AddPhotosProps) {
  const upload = useUploadPhotos(caseId);
  return (
    <PhotoUploadForm
      upload={upload}
      sendLabel={(n) => (n > 1 ? `Send ${n} photos` : "Send photo")}
      addedTitle={(n) => (n === 1 ? "1 photo added" : `${n} photos added`)}
      addedText="Thank you. Your landlord can see them now."
      onAdded={onAdded}
    />
  );
}
