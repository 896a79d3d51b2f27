"use client";

import {
  Area,
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceArea,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import type { Curve, Departure } from "@/lib/patterns-view/test-view";
import { PlotFrame } from "./plot-frame";

type Props = {
  title: string;
  name: string;
  curve: Curve;
  yLabel: string;
  theoLabel: string;
  colour: string;
  departures?: Departure[];
  caption?: string;
};

const r3 = (v: number) => Number(v.toFixed(4));

/** An observed curve against its pointwise simulation band and the null's curve, distance in metres. */
export function CurvePlot({ title, name, curve, yLabel, theoLabel, colour, departures = [], caption }: Props) {
  const rows = curve.r.map((r, k) => ({
    r: r3(r),
    obs: curve.obs[k],
    band: curve.lo && curve.hi && curve.lo[k] != null && curve.hi[k] != null ? [curve.lo[k], curve.hi[k]] : undefined,
    theo: curve.theo?.[k],
  }));
  const csv = () =>
    curve.r.map((r, k) => ({
      r,
      observed: curve.obs[k] ?? null,
      band_lo: curve.lo?.[k] ?? null,
      band_hi: curve.hi?.[k] ?? null,
      null_curve: curve.theo?.[k] ?? null,
    }));
  return (
    <PlotFrame title={title} name={name} csv={csv} caption={caption} height={250}>
      <ResponsiveContainer width="100%" height={250}>
        <ComposedChart data={rows} margin={{ top: 8, right: 12, bottom: 18, left: 8 }}>
          <CartesianGrid stroke="#e6dcc8" />
          <XAxis
            dataKey="r"
            type="number"
            domain={[0, "dataMax"]}
            tickFormatter={(v) => Number(v).toFixed(1)}
            label={{ value: "r (m)", position: "insideBottom", offset: -10 }}
            stroke="#5a4632"
          />
          <YAxis
            tickFormatter={(v) => Number(v).toFixed(2)}
            width={54}
            label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4 }}
            stroke="#5a4632"
          />
          {departures.map((d, i) => (
            <ReferenceArea
              key={i}
              x1={d.from}
              x2={d.to}
              fill={d.side === "above" ? "#1d5c8c" : "#9a3b12"}
              fillOpacity={0.07}
            />
          ))}
          <Area
            dataKey="band"
            stroke="none"
            fill="#8a7660"
            fillOpacity={0.28}
            isAnimationActive={false}
            name="Simulation band"
          />
          <Line
            dataKey="theo"
            stroke="#2e2116"
            strokeDasharray="5 4"
            dot={false}
            isAnimationActive={false}
            name={theoLabel}
            strokeWidth={1.2}
          />
          <Line dataKey="obs" stroke={colour} dot={false} isAnimationActive={false} name="Observed" strokeWidth={2.2} />
          <Tooltip
            formatter={(v) =>
              Array.isArray(v)
                ? v.map((x) => Number(x).toFixed(3)).join(" – ")
                : v == null
                  ? "undefined"
                  : Number(v).toFixed(3)
            }
            labelFormatter={(r) => `r = ${r} m`}
          />
        </ComposedChart>
      </ResponsiveContainer>
    </PlotFrame>
  );
}
