"use client";

import { useEffect, useState } from "react";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import type { Photo } from "./draw-marks";

/**
 * The fitted photo as the canvas draws it. Similarity and affine fits draw the display image with the
 * fit's own affine matrix (exact). Projective fits draw the raster the server warped, placed at its grid
 * bounds (an affine placement of an already-warped image), because a canvas cannot draw a homography.
 */
export function usePhotoLayer(photo: PhotoView | null, opacity: number): Photo | null {
  const fit = photo?.fit ?? null;
  const src = fit ? (fit.warp ? `${fit.warp.url}?v=${encodeURIComponent(fit.fittedAt)}` : photo!.displayUrl) : null;
  const [img, setImg] = useState<HTMLImageElement | null>(null);
  useEffect(() => {
    if (!src) return setImg(null);
    const el = new Image();
    el.onload = () => setImg(el);
    el.src = src;
    return () => {
      el.onload = null;
    };
  }, [src]);
  if (!fit || !img) return null;
  if (fit.warp) {
    const w = fit.warp;
    return {
      img,
      opacity,
      matrix: [(w.maxX - w.minX) / w.width, 0, w.minX, 0, -(w.maxY - w.minY) / w.height, w.maxY, 0, 0, 1],
    };
  }
  return { img, opacity, matrix: fit.matrix };
}
