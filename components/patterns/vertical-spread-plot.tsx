"use client";

import type { ScopeSummary } from "@/lib/api/patterns-responses";

type Cls = ScopeSummary["classes"][number];

const W_COL = 46;
const H = 150;
const PAD_TOP = 10;
const PAD_BOTTOM = 22;
const PAD_LEFT = 58;

const rl = (v: number) => v.toFixed(3);
/** The caution colour of tailwind.config.ts (warn). */
const WARN = "#9a3b12";

/**
 * Per class, a box of the reduced levels of its finds in scope: whisker from the lowest to the highest,
 * box between the quartiles, a tick at the median. Up is higher, as in a section. A class whose spread
 * exceeds the site's threshold is drawn in the caution colour and marked "!".
 */
export function VerticalSpreadPlot({ classes, threshold }: { classes: Cls[]; threshold: number }) {
  const levelled = classes.filter((c) => c.vertical.withLevel > 0);
  if (!levelled.length) return null;
  let lo = Math.min(...levelled.map((c) => c.vertical.min!));
  let hi = Math.max(...levelled.map((c) => c.vertical.max!));
  // At least the threshold's height, so a tight class does not fill the plot and look spread.
  if (hi - lo < threshold) {
    const mid = (hi + lo) / 2;
    lo = mid - threshold / 2;
    hi = mid + threshold / 2;
  }
  const y = (v: number) => PAD_TOP + ((hi - v) / (hi - lo)) * (H - PAD_TOP - PAD_BOTTOM);
  const width = PAD_LEFT + classes.length * W_COL + 8;
  return (
    <figure className="mt-2">
      <svg
        viewBox={`0 0 ${width} ${H}`}
        width="100%"
        style={{ maxWidth: width * 1.4 }}
        role="img"
        aria-label={`Vertical spread of each class's finds, reduced levels ${rl(lo)} to ${rl(hi)} m above the site datum`}
        data-testid="vertical-spread"
      >
        <line x1={PAD_LEFT - 4} x2={PAD_LEFT - 4} y1={y(hi)} y2={y(lo)} stroke="currentColor" strokeOpacity={0.5} />
        {[hi, lo].map((v) => (
          <text
            key={v}
            x={PAD_LEFT - 8}
            y={y(v) + 4}
            textAnchor="end"
            fontSize={10}
            className="num"
            fill="currentColor"
          >
            {rl(v)}
          </text>
        ))}
        {classes.map((c, i) => {
          const cx = PAD_LEFT + i * W_COL + W_COL / 2;
          const v = c.vertical;
          const tone = v.mixes ? WARN : c.colour;
          return (
            <g key={c.id} data-class={c.code} data-min={v.min ?? ""} data-max={v.max ?? ""}>
              {v.withLevel > 0 && (
                <>
                  <line x1={cx} x2={cx} y1={y(v.max!)} y2={y(v.min!)} stroke={tone} strokeWidth={1.5} />
                  <line x1={cx - 6} x2={cx + 6} y1={y(v.max!)} y2={y(v.max!)} stroke={tone} strokeWidth={1.5} />
                  <line x1={cx - 6} x2={cx + 6} y1={y(v.min!)} y2={y(v.min!)} stroke={tone} strokeWidth={1.5} />
                  <rect
                    x={cx - 10}
                    width={20}
                    y={y(v.q3!)}
                    height={Math.max(1.5, y(v.q1!) - y(v.q3!))}
                    fill={c.colour}
                    fillOpacity={0.25}
                    stroke={tone}
                    strokeWidth={v.mixes ? 2.5 : 1.5}
                  />
                  <line x1={cx - 10} x2={cx + 10} y1={y(v.median!)} y2={y(v.median!)} stroke={tone} strokeWidth={2.5} />
                </>
              )}
              <text x={cx} y={H - 6} textAnchor="middle" fontSize={11} fontWeight={700} fill="currentColor">
                {c.code}
                {v.mixes ? " !" : ""}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        Reduced level (RL), metres above the site datum: lowest to highest, quartiles and median of each class&apos;s
        finds in scope. Finds with no level are not drawn.
      </figcaption>
    </figure>
  );
}
