"use client";

import { startTransition, useEffect, useState, type CSSProperties, type ReactNode } from "react";

/**
 * Draws its children only after the frame that shows the rest of the page, as a transition: React then
 * renders them in slices between frames instead of one long task, so a finished run's verdict appears at
 * once and its figures follow a frame or two later while the page keeps answering. Until then a blank
 * box the size of the figure (`box`) keeps the layout from jumping.
 */
export function AfterPaint({ box, children }: { box: CSSProperties; children: ReactNode }) {
  const [ready, setReady] = useState(false);
  useEffect(() => {
    const frame = requestAnimationFrame(() => startTransition(() => setReady(true)));
    return () => cancelAnimationFrame(frame);
  }, []);
  return ready ? <>{children}</> : <div style={box} aria-hidden="true" />;
}
