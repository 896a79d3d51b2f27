import { describe, expect, it } from "vitest";
import config from "@/tailwind.config";

/** WCAG 2.2 relative luminance and contrast ratio (W3C, WCAG 2.2 §1.4.3 and its definitions). */
const luminance = (hex: string) => {
  const [r, g, b] = [1, 3, 5]
    .map((i) => parseInt(hex.slice(i, i + 2), 16) / 255)
    .map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
};
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
};

describe("the theme's text colours", () => {
  const c = config.theme.extend.colors;
  it("meet WCAG AA (4.5:1) for body text on every paper tone, the faint secondary ink included", () => {
    for (const ink of [c.ink.DEFAULT, c.ink.soft, c.ink.faint, c.accent.DEFAULT, c.warn.DEFAULT, c.ok.DEFAULT]) {
      for (const paper of [c.paper.DEFAULT, c.paper.deep])
        expect(contrast(ink, paper), `${ink} on ${paper}`).toBeGreaterThanOrEqual(4.5);
    }
    expect(contrast(c.warn.DEFAULT, c.warn.light)).toBeGreaterThanOrEqual(4.5);
    expect(contrast(c.ok.DEFAULT, c.ok.light)).toBeGreaterThanOrEqual(4.5);
  });
});
