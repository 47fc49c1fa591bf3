import { useCallback, useId, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { cn } from "@/lib/cn";
import { MAX_PHOTOS, PHOTO_ACCEPT, addPhotos, megabytes, type PhotoSelection } from "../lib/photo-files";

interface PhotoPickerProps {
  value: readonly File[];
  onChange: (files: File[]) => void;
  /** A message from the server about the last upload (415, 413), shown with the picker. */
  serverError?: string | null;
  disabled?: boolean;
  hint?: string;
}

const canPreview = () => typeof URL.createObjectURL === "function";

/**
 * A preview of a chosen file. Its object URL is made when the image is attached and released when
 * it is detached (a ref callback's cleanup), so StrictMode's second attach makes a fresh one.
 */
function FilePreview({ file, alt }: { file: File; alt: string }) {
  const attach = useCallback(
    (img: HTMLImageElement | null) => {
      if (!img) return;
      const url = URL.createObjectURL(file);
      img.src = url;
      return () => URL.revokeObjectURL(url);
    },
    [file],
  );
  return <img ref={attach} alt={alt} className="aspect-square w-full rounded-sm bg-paper object-cover" />;
}

/** Files that could not be added, each by its name with the reason. */
export function RefusedList({ files }: { files: readonly { name: string; message: string }[] }) {
  return (
    <ul className="flex flex-col gap-1">
      {files.map((p, i) => (
        <li key={`${p.name}-${i}`}>
          <span className="font-semibold break-all">{p.name}</span>: {p.message}
        </li>
      ))}
    </ul>
  );
}

/** Chooses up to ten photos, checks them in the browser, and shows what will be sent. */
export function PhotoPicker({ value, onChange, serverError, disabled, hint }: PhotoPickerProps) {
  const id = useId();
  const [problems, setProblems] = useState<PhotoSelection["problems"]>([]);
  const full = value.length >= MAX_PHOTOS;
  const hintText = hint ?? `JPEG, PNG, WebP or AVIF, up to 15 MB each. You can add up to ${MAX_PHOTOS}.`;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="font-semibold text-ink">
          Add photos
        </label>
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hintText}
        </p>
        <input
          id={id}
          type="file"
          accept={PHOTO_ACCEPT}
          multiple
          disabled={disabled || full}
          aria-describedby={`${id}-hint${problems.length ? ` ${id}-problems` : ""}`}
          onChange={(e) => {
            const picked = Array.from(e.target.files ?? []);
            // Cleared so that the same photo can be picked again after removing it.
            e.target.value = "";
            if (picked.length === 0) return;
            const next = addPhotos(value, picked);
            setProblems(next.problems);
            if (next.accepted.length !== value.length) onChange(next.accepted);
          }}
          className={cn(
            "block w-full text-base text-ink file:mr-3 file:min-h-11 file:cursor-pointer file:rounded-md file:border file:border-line-strong",
            "file:bg-surface file:px-4 file:font-semibold file:text-dew-800 hover:file:bg-dew-50 disabled:opacity-60",
          )}
        />
        {full ? (
          <p className="text-sm text-ink-soft">You have chosen {MAX_PHOTOS} photos, the most we can take at once.</p>
        ) : null}
      </div>

      {problems.length ? (
        <div id={`${id}-problems`}>
          <Alert
            tone="warning"
            title={problems.length === 1 ? "One file could not be added" : `${problems.length} files could not be added`}
            live="alert"
          >
            <RefusedList files={problems} />
          </Alert>
        </div>
      ) : null}
      {serverError ? (
        <Alert tone="danger" title="The photos were not added">
          {serverError}
        </Alert>
      ) : null}

      {value.length ? (
        <ul aria-label="Photos you have chosen" className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          {value.map((file, i) => {
            return (
              <li
                key={`${file.name}-${file.size}-${file.lastModified}`}
                className="flex flex-col gap-1 rounded-md border border-line bg-surface p-2"
              >
                {canPreview() ? (
                  <FilePreview file={file} alt={`Chosen file ${i + 1}, ${file.name}`} />
                ) : (
                  <div className="flex aspect-square w-full items-center justify-center rounded-sm bg-paper text-sm text-ink-soft">
                    Photo {i + 1}
                  </div>
                )}
                <span className="truncate text-sm" title={file.name}>
                  {file.name}
                </span>
                <span className="text-xs text-ink-soft">{megabytes(file.size)}</span>
                <button
                  type="button"
                  disabled={disabled}
                  onClick={() => {
                    setProblems([]);
                    onChange(value.filter((f) => f !== file));
                  }}
                  className="min-h-9 rounded-md border border-line-strong px-2 text-sm font-semibold text-ink hover:bg-rust-50 disabled:opacity-60"
                >
                  Remove
                  <span className="sr-only">
                    {" "}
                    photo {i + 1}, {file.name}
                  </span>
                </button>
              </li>
            );
          })}
        </ul>
      ) : null}
    </div>
  );
}
