"use client";

import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import { PhotoFitPanel, type PhotoFitControls } from "./photo-fit-panel";
import { PhotoUpload } from "./photo-upload";

export function PhotoPanel({
  siteId,
  trenchId,
  photos,
  photo,
  canEdit,
  onPhoto,
  onUploaded,
  onDelete,
  fit,
}: {
  siteId: string;
  trenchId: string;
  photos: PhotoView[];
  photo: PhotoView | null;
  canEdit: boolean;
  onPhoto: (id: string) => void;
  onUploaded: (id: string) => void;
  onDelete: (id: string) => void;
  fit: PhotoFitControls;
}) {
  return (
    <div className="space-y-4">
      {canEdit && <PhotoUpload siteId={siteId} trenchId={trenchId} onUploaded={onUploaded} />}
      {photos.length > 1 && (
        <div className="flex flex-wrap gap-2" aria-label="Photos of this trench">
          {photos.map((p) => (
            <button
              key={p.id}
              type="button"
              onClick={() => onPhoto(p.id)}
              aria-pressed={p.id === photo?.id}
              className={`rounded border-2 p-1 ${p.id === photo?.id ? "border-accent" : "border-paper-edge"}`}
            >
              <img src={p.thumbUrl} alt={p.fileName} className="h-16 w-auto" />
              <span className="block text-xs">{p.fit ? "fitted" : "not fitted"}</span>
            </button>
          ))}
        </div>
      )}
      {photo ? (
        <>
          <PhotoFitPanel photo={photo} canEdit={canEdit} {...fit} />
          {canEdit && (
            <button
              type="button"
              className="btn-danger"
              onClick={() =>
                window.confirm(`Delete the photo “${photo.fileName}” and its fit? Finds and the outline stay.`) &&
                onDelete(photo.id)
              }
            >
              Delete this photo
            </button>
          )}
        </>
      ) : (
        <p className="text-ink-soft">No photo of this trench yet.</p>
      )}
    </div>
  );
}
