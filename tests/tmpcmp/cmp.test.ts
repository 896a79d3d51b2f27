import { createElement as h } from "react";
import { it, expect } from "vitest";
import { renderToStaticMarkup } from "react-dom/server";
import { LabelSheets } from "@/components/labels/label-sheets";
import { LabelSheets as Old } from "./old-labels";
import { labelPresets } from "@/lib/labels/layout";
it("same", () => {
  const base = { trenchCode: "A", contextNumber: 1005, what: "Flint", date: "14 Jul 2026", recorder: "Ada" };
  const items = [
    { ...base, key: "f1", kindWord: "Find" as const, number: 12, code: "WHD26-F12" },
    { ...base, key: "s1", kindWord: "Sample" as const, number: 3, code: "WHD26-S3" },
    { ...base, key: "b1", kindWord: "Box" as const, number: 4, code: "WHD26-B4", contents: ["F12 flint 1005", "S3 soil"] },
  ];
  for (const { layout } of Object.values(labelPresets)) {
    const a = renderToStaticMarkup(h(LabelSheets, { items, layout, siteCode: "WHD26" } as never));
    const b = renderToStaticMarkup(h(Old, { items, layout, siteCode: "WHD26" } as never));
    expect(a.length).toBeGreaterThan(1000);
    expect(a).toBe(b);
  }
});
