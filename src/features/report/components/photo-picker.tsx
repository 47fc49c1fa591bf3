import type { TFunction } from "i18next";
import { useCallback, useId, useState } from "react";
import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { cn } from "@/lib/cn";
import { i18n } from "@/lib/i18n/i18n";
import { MAX_PHOTOS, PHOTO_ACCEPT, addPhotos, megabytesOf, type PhotoSelection } from "../lib/photo-files";

/** "2.4 MB" in the reader's language. */
export const megabytes = (t: TFunction, bytes: number) => {
  const { key, mb } = megabytesOf(bytes);
  return t(`report:photos.${key}`, { mb });
};

/** Why the browser would not take a file, in the reader's language. */
export const problemText = (t: TFunction, p: PhotoSelection["problems"][number]) =>
  t(`report:photos.problem.${p.problem}`, { size: megabytes(t, p.size), max: MAX_PHOTOS });

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
          <span className="font-semibold break-all" translate="no">
            {p.name}
          </span>
          : {p.message}
        </li>
      ))}
    </ul>
  );
}

/** Chooses up to ten photos, checks them in the browser, and shows what will be sent. */
export function PhotoPicker({ value, onChange, serverError, disabled, hint }: PhotoPickerProps) {
  const { t } = useTranslation("report", { i18n });
  const id = useId();
  const [problems, setProblems] = useState<PhotoSelection["problems"]>([]);
  const full = value.length >= MAX_PHOTOS;
  const hintText = hint ?? t("photos.hint", { max: MAX_PHOTOS });

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="font-semibold text-ink">
          {t("photos.add")}
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
        {full ? <p className="text-sm text-ink-soft">{t("photos.full", { max: MAX_PHOTOS })}</p> : null}
      </div>

      {problems.length ? (
        <div id={`${id}-problems`}>
          <Alert tone="warning" title={t("photos.refusedTitle", { count: problems.length })} live="alert">
            <RefusedList files={problems.map((p) => ({ name: p.name, message: problemText(t, p) }))} />
          </Alert>
        </div>
      ) : null}
      {serverError ? (
        <Alert tone="danger" title={t("photos.serverRefused")}>
          {serverError}
        </Alert>
      ) : null}

      {value.length ? (
        <ul aria-label={t("photos.chosen")} className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          {value.map((file, i) => {
            return (
              <li
                key={`${file.name}-${file.size}-${file.lastModified}`}
                className="flex flex-col gap-1 rounded-md border border-line bg-surface p-2"
              >
                {canPreview() ? (
                  <FilePreview file={file} alt={t("photos.previewAlt", { n: i + 1, name: file.name })} />
                ) : (
                  <div className="flex aspect-square w-full items-center justify-center rounded-sm bg-paper text-sm text-ink-soft">
                    {t("photos.placeholder", { n: i + 1 })}
                  </div>
                )}
                <span className="truncate text-sm" title={file.name} translate="no">
                  {file.name}
                </span>
                <span className="text-xs text-ink-soft">{megabytes(t, file.size)}</span>
                <button
                  type="button"
                  disabled={disabled}
                  onClick={() => {
                    setProblems([]);
                    onChange(value.filter((f) => f !== file));
                  }}
                  className="min-h-9 rounded-md border border-line-strong px-2 text-sm font-semibold text-ink hover:bg-rust-50 disabled:opacity-60"
                >
                  {t("photos.remove")}
                  <span className="sr-only"> {t("photos.removeWhich", { n: i + 1, name: file.name })}</span>
                </button>
              </li>
            );
          })}
        </ul>
      ) : null}
    </div>
  );
}
