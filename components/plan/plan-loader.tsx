"use client";

import dynamic from "next/dynamic";
import type { PlanScreenProps } from "./plan-screen";

/** Konva needs the browser: the plan is loaded on the client only. */
const PlanScreen = dynamic(() => import("./plan-screen"), {
  ssr: false,
  loading: () => (
    <p className="p-6 text-ink-soft" role="status">
      Opening the plan…
    </p>
  ),
});

export function PlanLoader(props: PlanScreenProps) {
  return <PlanScreen {...props} />;
}
