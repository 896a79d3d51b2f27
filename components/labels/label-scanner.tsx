"use client";

import jsQR from "jsqr";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState } from "react";
import { labelPath, parseLabelCode } from "@/lib/labels/code";

type Detector = { detect: (source: CanvasImageSource) => Promise<{ rawValue: string }[]> };
type DetectorClass = new (options: { formats: string[] }) => Detector;

/** The browser's own barcode detector where it has one for QR codes, else null (jsqr reads the pixels). */
async function nativeDetector(): Promise<Detector | null> {
  const Ctor = (globalThis as { BarcodeDetector?: DetectorClass & { getSupportedFormats?: () => Promise<string[]> } })
    .BarcodeDetector;
  if (!Ctor) return null;
  try {
    const formats = (await Ctor.getSupportedFormats?.()) ?? ["qr_code"];
    return formats.includes("qr_code") ? new Ctor({ formats: ["qr_code"] }) : null;
  } catch {
    return null;
  }
}

/** Reads the QR codes in one frame: the native detector first, jsqr on the canvas's pixels otherwise. */
async function readFrame(
  source: CanvasImageSource,
  width: number,
  height: number,
  canvas: HTMLCanvasElement,
  detector: Detector | null,
): Promise<string[]> {
  if (detector) {
    try {
      return (await detector.detect(source)).map((c) => c.rawValue);
    } catch {
      // fall through to jsqr
    }
  }
  const scale = Math.min(1, 1600 / Math.max(width, height));
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const ctx = canvas.getContext("2d", { willReadFrequently: true });
  if (!ctx) return [];
  ctx.drawImage(source, 0, 0, canvas.width, canvas.height);
  const img = ctx.getImageData(0, 0, canvas.width, canvas.height);
  const hit = jsQR(img.data, img.width, img.height);
  return hit ? [hit.data] : [];
}

/**
 * The scan action: the camera (or a photo of the label) read for a Loamwork code, which opens its record on
 * this server whatever address was printed in front of it.
 */
export function LabelScanner() {
  const router = useRouter();
  const video = useRef<HTMLVideoElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const [camera, setCamera] = useState<"off" | "on" | "refused">("off");
  const [message, setMessage] = useState<string>("");
  const [typed, setTyped] = useState("");

  const open = (texts: string[]): boolean => {
    for (const t of texts) {
      const ref = parseLabelCode(t);
      if (ref) {
        setMessage(`Opening ${ref.kind === "F" ? "find" : "sample"} ${ref.number} of ${ref.siteCode}…`);
        router.push(labelPath(ref));
        return true;
      }
    }
    if (texts.length) setMessage(`That code is not a Loamwork label: ${texts[0]}`);
    return false;
  };

  useEffect(() => {
    if (camera !== "on") return;
    let stream: MediaStream | null = null;
    let stopped = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    (async () => {
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: "environment" }, audio: false });
      } catch {
        setCamera("refused");
        return;
      }
      const v = video.current;
      if (!v || stopped) return;
      v.srcObject = stream;
      await v.play().catch(() => undefined);
      const detector = await nativeDetector();
      const tick = async () => {
        if (stopped || !canvas.current) return;
        if (v.videoWidth > 0 && open(await readFrame(v, v.videoWidth, v.videoHeight, canvas.current, detector))) return;
        timer = setTimeout(tick, 250);
      };
      void tick();
    })();
    return () => {
      stopped = true;
      if (timer) clearTimeout(timer);
      stream?.getTracks().forEach((t) => t.stop());
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [camera]);

  const fromPhoto = async (file: File | undefined) => {
    if (!file || !canvas.current) return;
    setMessage("Reading the photo…");
    const bitmap = await createImageBitmap(file);
    const found = await readFrame(bitmap, bitmap.width, bitmap.height, canvas.current, await nativeDetector());
    bitmap.close();
    if (!open(found) && !found.length)
      setMessage("No code found in that photo; hold the label flat and fill the frame.");
  };

  return (
    <div className="space-y-4">
      <div className="sheet space-y-3">
        {camera === "on" ? (
          <>
            <video ref={video} className="w-full rounded bg-ink" muted playsInline aria-label="Camera view" />
            <button type="button" className="btn" onClick={() => setCamera("off")}>
              Stop the camera
            </button>
          </>
        ) : (
          <button type="button" className="btn-primary" onClick={() => setCamera("on")}>
            Scan with the camera
          </button>
        )}
        {camera === "refused" && (
          <p className="field-error">
            The camera could not be opened (no camera, or permission refused). Take a photo of the label below instead.
          </p>
        )}
      </div>
      <div className="sheet">
        <label className="label" htmlFor="scan-photo">
          Or a photo of the label
        </label>
        <input
          id="scan-photo"
          type="file"
          accept="image/*"
          capture="environment"
          className="field"
          onChange={(e) => void fromPhoto(e.target.files?.[0])}
        />
      </div>
      <form
        className="sheet flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          open([typed]);
        }}
      >
        <div className="grow">
          <label className="label" htmlFor="scan-typed">
            Or type the code
          </label>
          <input
            id="scan-typed"
            className="field font-mono"
            placeholder="LW/WHD26/F/1234"
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
          />
        </div>
        <button type="submit" className="btn">
          Open
        </button>
      </form>
      <p role="status" aria-live="polite" className="font-semibold">
        {message}
      </p>
      <canvas ref={canvas} hidden />
    </div>
  );
}
