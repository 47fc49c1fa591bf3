import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/lib/dates";
import type { CasePhoto } from "../api/types";
import { Modal } from "./modal";

interface PhotoGalleryProps {
  photos: readonly CasePhoto[];
  emptyText?: string;
}

/** Thumbnails that open a full-size view; the view pages through the photos with buttons or arrow keys. */
export function PhotoGallery({ photos, emptyText = "No photos yet." }: PhotoGalleryProps) {
  const [open, setOpen] = useState<number | null>(null);
  const closeRef = useRef<HTMLButtonElement>(null);

  if (photos.length === 0) return <EmptyState title={emptyText} />;
  const current = open === null ? null : photos[open];
  const step = (by: number) => setOpen((i) => (i === null ? i : (i + by + photos.length) % photos.length));

  return (
    <>
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        {photos.map((photo, i) => (
          <li key={photo.id}>
            <button
              type="button"
              onClick={() => setOpen(i)}
              className="group block w-full overflow-hidden rounded-md border border-line bg-paper text-left hover:border-dew-700"
            >
              <img
                src={photo.thumbnailUrl}
                alt=""
                loading="lazy"
                width={photo.width}
                height={photo.height}
                className="aspect-square w-full object-cover group-hover:opacity-90"
              />
              <span className="block px-2 py-1 text-sm">
                <span className="sr-only">Open photo </span>
                {i + 1}
                <span className="sr-only"> of {photos.length}</span>
                <span className="text-ink-soft">, added {formatDateTime(photo.createdAt)}</span>
              </span>
            </button>
          </li>
        ))}
      </ul>

      <Modal
        open={current !== null && current !== undefined}
        onClose={() => setOpen(null)}
        title={open === null ? "Photo" : `Photo ${open + 1} of ${photos.length}`}
        initialFocusRef={closeRef}
        onKeyDown={(e) => {
          if (e.key === "ArrowRight") step(1);
          if (e.key === "ArrowLeft") step(-1);
        }}
        className="w-[min(64rem,calc(100vw-1rem))]"
      >
        {current ? (
          <div className="flex flex-col gap-3">
            <img
              src={current.url}
              alt={`${open! + 1} of ${photos.length}, added ${formatDateTime(current.createdAt)}`}
              width={current.width}
              height={current.height}
              className="mx-auto h-auto max-h-[70dvh] w-auto max-w-full rounded-md bg-paper object-contain"
            />
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div className="flex gap-2">
                {photos.length > 1 ? (
                  <>
                    <Button variant="secondary" size="sm" onClick={() => step(-1)}>
                      <span aria-hidden="true">‹</span> Previous photo
                    </Button>
                    <Button variant="secondary" size="sm" onClick={() => step(1)}>
                      Next photo <span aria-hidden="true">›</span>
                    </Button>
                  </>
                ) : null}
              </div>
              <div className="flex items-center gap-3">
                <a href={current.url} target="_blank" rel="noreferrer" className="text-sm font-semibold text-dew-700 underline">
                  Open in a new tab
                </a>
                <Button ref={closeRef} size="sm" onClick={() => setOpen(null)}>
                  Close
                </Button>
              </div>
            </div>
          </div>
        ) : null}
      </Modal>
    </>
  );
}
