// Reusable photo pieces: a capture/upload control for phones, a thumbnail strip and a lightbox.
// They take ownerType/ownerId so any feature can drop them onto its records.
import { useEffect, useRef, useState } from "react";
import { photoViews, type PhotoDto, type PhotoView } from "@shared/schemas/photos";
import { Limits } from "@shared/constants";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { cn } from "@/utils/cn";
import { useDeletePhoto, usePhotos, useUploadPhoto } from "./use-photos";
import { ConfirmDialog } from "@/components/ui/dialog";

export const viewLabels: Record<PhotoView, string> = {
  front: "Front",
  back: "Back",
  left: "Left",
  right: "Right",
  detail: "Detail",
  other: "Other",
};

/** A photo chosen on the device but not uploaded yet. */
export interface PendingPhoto {
  id: string;
  file: File;
  view: PhotoView;
  previewUrl: string;
}

/**
 * Take or choose photos: the camera opens directly on phones (`capture="environment"`), one tap per
 * view. Calls `onAdd` with the files; the parent decides when to upload.
 */
export function PhotoCapture({
  onAdd,
  nextView,
  disabled,
}: {
  onAdd: (photos: PendingPhoto[]) => void;
  nextView?: PhotoView;
  disabled?: boolean;
}) {
  const [view, setView] = useState<PhotoView>(nextView ?? "front");
  const cameraRef = useRef<HTMLInputElement>(null);
  const libraryRef = useRef<HTMLInputElement>(null);
  // The suggested next view replaces the chosen one when it changes (adjusted while rendering).
  const [suggested, setSuggested] = useState(nextView);
  if (suggested !== nextView) {
    setSuggested(nextView);
    if (nextView) setView(nextView);
  }
  const take = (files: FileList | null) => {
    if (!files?.length) return;
    const list = [...files].map(
      (file, i) =>
        ({
          id: `${Date.now()}-${i}-${file.name}`,
          file,
          view: i === 0 ? view : "other",
          previewUrl: URL.createObjectURL(file),
        }) as PendingPhoto,
    );
    onAdd(list);
    if (cameraRef.current) cameraRef.current.value = "";
    if (libraryRef.current) libraryRef.current.value = "";
  };
  return (
    <div className="grid gap-2">
      <fieldset>
        <legend className="mb-1 text-sm font-semibold text-ink-900">View</legend>
        <div className="flex flex-wrap gap-1.5" role="radiogroup" aria-label="View">
          {photoViews
            .filter((v) => v !== "other")
            .map((v) => (
              <button
                key={v}
                type="button"
                role="radio"
                aria-checked={view === v}
                onClick={() => setView(v)}
                className={cn(
                  "min-h-11 rounded-md border px-3 text-sm font-semibold",
                  view === v ? "border-ink bg-ink text-chalk" : "border-ink-100 bg-white text-ink",
                )}
              >
                {viewLabels[v]}
              </button>
            ))}
        </div>
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button size="lg" onClick={() => cameraRef.current?.click()} disabled={disabled}>
          Take photo ({viewLabels[view].toLowerCase()})
        </Button>
        <Button size="lg" variant="secondary" onClick={() => libraryRef.current?.click()} disabled={disabled}>
          Choose photos
        </Button>
      </div>
      <input
        ref={cameraRef}
        type="file"
        accept="image/*"
        capture="environment"
        className="sr-only"
        aria-label="Take photo"
        onChange={(e) => take(e.target.files)}
        tabIndex={-1}
      />
      <input
        ref={libraryRef}
        type="file"
        accept="image/jpeg,image/png,image/webp,image/avif,image/tiff"
        multiple
        className="sr-only"
        aria-label="Choose photos"
        onChange={(e) => take(e.target.files)}
        tabIndex={-1}
      />
      <p className="text-xs text-slate">
        Up to {Limits.photoMaxFiles} photos, {Math.round(Limits.photoMaxBytes / 1024 / 1024)} MB each. Location and camera data are removed
        when stored.
      </p>
    </div>
  );
}

/** Thumbnails of photos; a tap opens the lightbox. */
export function PhotoStrip({
  photos,
  label,
  onDelete,
  size = "md",
}: {
  photos: PhotoDto[];
  label?: string;
  onDelete?: (p: PhotoDto) => void;
  size?: "sm" | "md";
}) {
  const [open, setOpen] = useState<number | null>(null);
  if (!photos.length) return <p className="text-xs text-slate">No photos.</p>;
  const box = size === "sm" ? "size-16" : "size-24";
  return (
    <>
      <ul className="flex flex-wrap gap-2" aria-label={label ?? "Photos"}>
        {photos.map((p, i) => (
          <li key={p.id} className="relative">
            <button
              type="button"
              onClick={() => setOpen(i)}
              className={cn("block overflow-hidden rounded border border-chalk-200 bg-chalk", box)}
              aria-label={`Open ${viewLabels[p.view].toLowerCase()} photo`}
            >
              <img
                src={p.urls.thumb}
                alt={`${viewLabels[p.view]} view${p.caption ? `: ${p.caption}` : ""}`}
                loading="lazy"
                className="size-full object-cover"
                width={96}
                height={96}
              />
            </button>
            <span className="absolute bottom-0 left-0 rounded-tr bg-ink/80 px-1 text-[10px] text-chalk">{viewLabels[p.view]}</span>
            {onDelete && (
              <button
                type="button"
                className="absolute -top-2 -right-2 size-6 rounded-full bg-madder text-xs text-white"
                aria-label={`Delete ${viewLabels[p.view].toLowerCase()} photo`}
                onClick={() => onDelete(p)}
              >
                ×
              </button>
            )}
          </li>
        ))}
      </ul>
      {open !== null && <Lightbox photos={photos} index={open} onIndex={setOpen} onClose={() => setOpen(null)} />}
    </>
  );
}

/** Full-screen viewer: display size, arrow keys to move, a link to the full-resolution file. */
export function Lightbox({
  photos,
  index,
  onIndex,
  onClose,
}: {
  photos: PhotoDto[];
  index: number;
  onIndex: (i: number) => void;
  onClose: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const p = photos[index]!;
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal?.();
  }, []);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "ArrowRight") onIndex(Math.min(photos.length - 1, index + 1));
      if (e.key === "ArrowLeft") onIndex(Math.max(0, index - 1));
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [index, onIndex, photos.length]);
  return (
    <dialog
      ref={ref}
      aria-label="Photo"
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-0 h-dvh max-h-none w-screen max-w-none bg-ink-900/95 p-0 text-chalk backdrop:bg-ink-900/80"
    >
      <div className="flex h-full flex-col">
        <div className="flex items-center gap-2 p-2">
          <span className="text-sm">
            {viewLabels[p.view]} · {p.width} × {p.height} px {p.caption ? `· ${p.caption}` : ""} ({index + 1}/{photos.length})
          </span>
          <a href={p.urls.original} target="_blank" rel="noreferrer" className="ml-auto rounded px-2 py-1 text-sm underline">
            Full resolution
          </a>
          <Button variant="secondary" size="sm" onClick={onClose}>
            Close
          </Button>
        </div>
        <div className="relative flex min-h-0 flex-1 items-center justify-center">
          <img src={p.urls.display} alt={`${viewLabels[p.view]} view, full size`} className="max-h-full max-w-full object-contain" />
          {index > 0 && (
            <button
              type="button"
              aria-label="Previous photo"
              className="absolute left-1 min-h-12 rounded bg-ink/60 px-3 text-2xl"
              onClick={() => onIndex(index - 1)}
            >
              ‹
            </button>
          )}
          {index < photos.length - 1 && (
            <button
              type="button"
              aria-label="Next photo"
              className="absolute right-1 min-h-12 rounded bg-ink/60 px-3 text-2xl"
              onClick={() => onIndex(index + 1)}
            >
              ›
            </button>
          )}
        </div>
      </div>
    </dialog>
  );
}

/** Photos of one record with an uploader for those allowed to add them. */
export function OwnerPhotos({
  productionId,
  ownerType,
  ownerId,
  canEdit,
  title = "Photos",
}: {
  productionId: string;
  ownerType: string;
  ownerId: string;
  canEdit: boolean;
  title?: string;
}) {
  const photos = usePhotos(productionId, ownerType, ownerId);
  const upload = useUploadPhoto(productionId, ownerType, ownerId);
  const del = useDeletePhoto(productionId, ownerType, ownerId);
  const [deleting, setDeleting] = useState<PhotoDto | null>(null);
  const [failed, setFailed] = useState<PendingPhoto[]>([]);
  const send = async (list: PendingPhoto[]) => {
    const left: PendingPhoto[] = [];
    for (const p of list) {
      try {
        await upload.mutateAsync({ file: p.file, view: p.view });
      } catch {
        left.push(p);
      }
    }
    setFailed(left);
  };
  return (
    <section aria-label={title} className="grid gap-2">
      <h2 className="text-sm font-semibold text-ink">{title}</h2>
      {photos.isPending ? (
        <Spinner />
      ) : photos.error ? (
        <ErrorAlert error={photos.error} />
      ) : (
        <PhotoStrip photos={photos.data} onDelete={canEdit ? setDeleting : undefined} />
      )}
      {del.error && <ErrorAlert error={del.error} title="Photo not deleted" />}
      <ConfirmDialog
        open={Boolean(deleting)}
        title={`Delete this ${deleting ? viewLabels[deleting.view].toLowerCase() : ""} photo?`}
        confirmLabel="Delete photo"
        danger
        busy={del.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={() => deleting && del.mutate(deleting.id, { onSettled: () => setDeleting(null) })}
      >
        The photo and its smaller sizes are deleted. This cannot be undone.
      </ConfirmDialog>
      {upload.error && <ErrorAlert error={upload.error} title="Photo not saved" />}
      {failed.length > 0 && (
        <Button variant="secondary" onClick={() => send(failed)}>
          Retry {failed.length} photo{failed.length > 1 ? "s" : ""}
        </Button>
      )}
      {canEdit && <PhotoCapture onAdd={send} disabled={upload.isPending} />}
    </section>
  );
}
