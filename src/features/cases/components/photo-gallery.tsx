import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/lib/dates";
import type { CasePhoto } from "../api/types";
import { Modal } from "./modal";

/**
 * What the gallery says. Staff pages share the gallery and never load i18next, so it takes its words as a
 * prop, English by default; the tenant's case page passes them in the tenant's language.
 */
export interface PhotoGalleryWords {
  /** The thumbnail's label: "Open photo 2 of 5, added 10 Jan 2026, 08:01" with the screen-reader parts apart. */
  open: string;
  of: (total: number) => string;
  added: (iso: string) => string;
  title: (n: number, total: number) => string;
  photo: string;
  alt: (n: number, total: number, iso: string) => string;
  previous: string;
  next: string;
  newTab: string;
  close: string;
}

export const englishPhotoGalleryWords: PhotoGalleryWords = {
  open: "Open photo ",
  of: (total) => ` of ${total}`,
  added: (iso) => `, added ${formatDateTime(iso)}`,
  title: (n, total) => `Photo ${n} of ${total}`,
  photo: "Photo",
  alt: (n, total, iso) => `${n} of ${total}, added ${formatDateTime(iso)}`,
  previous: "Previous photo",
  next: "Next photo",
  newTab: "Open in a new tab",
  close: "Close",
};

interface PhotoGalleryProps {
  photos: readonly CasePhoto[];
  emptyText?: string;
  words?: PhotoGalleryWords;
}

/** Thumbnails that open a full-size view; the view pages through the photos with buttons or arrow keys. */
export function PhotoGallery({ photos, emptyText = "No photos yet.", words = englishPhotoGalleryWords }: PhotoGalleryProps) {
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
                <span className="sr-only">{words.open}</span>
                <span translate="no">{i + 1}</span>
                <span className="sr-only">{words.of(photos.length)}</span>
                <span className="text-ink-soft">{words.added(photo.createdAt)}</span>
              </span>
            </button>
          </li>
        ))}
      </ul>

      <Modal
        open={current !== null && current !== undefined}
        onClose={() => setOpen(null)}
        title={open === null ? words.photo : words.title(open + 1, photos.length)}
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
              alt={words.alt(open! + 1, photos.length, current.createdAt)}
              width={current.width}
              height={current.height}
              className="mx-auto h-auto max-h-[70dvh] w-auto max-w-full rounded-md bg-paper object-contain"
            />
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div className="flex gap-2">
                {photos.length > 1 ? (
                  <>
                    <Button variant="secondary" size="sm" onClick={() => step(-1)}>
                      <span aria-hidden="true">‹</span> {words.previous}
                    </Button>
                    <Button variant="secondary" size="sm" onClick={() => step(1)}>
                      {words.next} <span aria-hidden="true">›</span>
                    </Button>
                  </>
                ) : null}
              </div>
              <div className="flex items-center gap-3">
                <a href={current.url} target="_blank" rel="noreferrer" className="text-sm font-semibold text-dew-700 underline">
                  {words.newTab}
                </a>
                <Button ref={closeRef} size="sm" onClick={() => setOpen(null)}>
                  {words.close}
                </Button>
              </div>
            </div>
          </div>
        ) : null}
      </Modal>
    </>
  );
}
