import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { errorMessage } from "@/lib/api-client";
import { useUploadPhotos } from "../api/upload-photos";
import { PhotoPicker } from "./photo-picker";

interface AddPhotosProps {
  caseId: number;
  /** After photos were added: the page refreshes what it shows. */
  onAdded?: (count: number) => void;
}

/** More photos for a report that has been sent: the same picker as the report form. */
export function AddPhotos({ caseId, onAdded }: AddPhotosProps) {
  const [files, setFiles] = useState<File[]>([]);
  const [added, setAdded] = useState<number | null>(null);
  const upload = useUploadPhotos(caseId);

  return (
    <div className="flex flex-col gap-4">
      <PhotoPicker
        value={files}
        onChange={(next) => {
          setFiles(next);
          setAdded(null);
          upload.reset();
        }}
        serverError={upload.isError ? errorMessage(upload.error) : null}
        disabled={upload.isPending}
      />
      {added !== null ? (
        <Alert tone="success" title={added === 1 ? "1 photo added" : `${added} photos added`}>
          Thank you. Your landlord can see them now.
        </Alert>
      ) : null}
      <div>
        <Button
          disabled={files.length === 0}
          busy={upload.isPending}
          onClick={() =>
            upload.mutate(files, {
              onSuccess: (result) => {
                setFiles([]);
                setAdded(result.photos.length);
                onAdded?.(result.photos.length);
              },
            })
          }
        >
          {files.length > 1 ? `Send ${files.length} photos` : "Send photo"}
        </Button>
      </div>
    </div>
  );
}
