"use client";

import { generateReactHelpers } from "@uploadthing/react";
import { useState } from "react";
import type { UploadRouter } from "@/lib/server/uploads/file-router";

const { useUploadThing } = generateReactHelpers<UploadRouter>();

/** Mirrors the server's limits so a refusal can be explained before anything is sent. */
const TYPES = ["image/jpeg", "image/png", "image/webp", "image/tiff", "image/heic", "image/heif", "image/avif"];
const MAX = 16 * 1024 * 1024;

export function PhotoUpload({
  siteId,
  trenchId,
  onUploaded,
}: {
  siteId: string;
  trenchId: string;
  onUploaded: (photoId: string) => void;
}) {
  const [message, setMessage] = useState<{ kind: "ok" | "warn"; text: string } | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const { startUpload, isUploading } = useUploadThing("trenchPhoto", {
    onUploadProgress: (p) => setProgress(p),
    onUploadError: (e) => {
      setProgress(null);
      setMessage({ kind: "warn", text: `Upload refused: ${e.message}` });
    },
  });

  const pick = async (file: File | undefined) => {
    if (!file) return;
    setMessage(null);
    if (!TYPES.includes(file.type))
      return setMessage({
        kind: "warn",
        text: `“${file.name}” is ${file.type || "of no known type"}, not a photo: choose a JPEG, PNG, WebP, TIFF, HEIF or AVIF image.`,
      });
    if (file.size > MAX)
      return setMessage({
        kind: "warn",
        text: `“${file.name}” is ${(file.size / 1048576).toFixed(1)} MB; the limit for a plan photo is 16 MB.`,
      });
    setProgress(0);
    const res = await startUpload([file], { siteId, trenchId }).catch((e: Error) => {
      setMessage({ kind: "warn", text: `Upload failed: ${e.message}` });
      return undefined;
    });
    setProgress(null);
    const data = res?.[0]?.serverData;
    if (!res) return;
    if (!data || data.error || !data.photoId)
      return setMessage({
        kind: "warn",
        text: `Upload refused: ${data?.error ?? "the server did not record the photo."}`,
      });
    setMessage({ kind: "ok", text: `“${file.name}” uploaded. Now tap pegs on it to fit it to the grid.` });
    onUploaded(data.photoId);
  };

  return (
    <div className="space-y-2">
      <label className={`btn-primary cursor-pointer ${isUploading ? "pointer-events-none opacity-60" : ""}`}>
        {isUploading ? `Uploading… ${progress ?? 0}%` : "Upload a trench photo"}
        <input
          type="file"
          accept="image/*"
          className="sr-only"
          data-testid="photo-input"
          onChange={(e) => {
            void pick(e.target.files?.[0]);
            e.target.value = "";
          }}
          disabled={isUploading}
        />
      </label>
      <p className="text-sm text-ink-soft">A vertical photo of the trench, JPEG/PNG/WebP/TIFF/HEIF, up to 16 MB.</p>
      {message && (
        <p
          role={message.kind === "warn" ? "alert" : "status"}
          className={`rounded border-2 p-2 font-semibold ${message.kind === "warn" ? "border-warn bg-warn-light text-warn" : "border-ok bg-ok-light text-ok"}`}
        >
          {message.text}
        </p>
      )}
    </div>
  );
}
