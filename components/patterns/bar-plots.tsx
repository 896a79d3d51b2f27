"use client";

import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ClarkEvansView } from "@/lib/patterns-view/test-view";
import { PlotFrame } from "./plot-frame";

/** Nearest-neighbour distances of one class, binned. */
export function NnHistogram({ t, code, colour }: { t: ClarkEvansView; code: string; colour: string }) {
  const { edges, counts } = t.histogram;
  // Bin k runs from edge k to edge k + 1; a count without both edges has no place on the axis.
  const bins = counts.flatMap((count, k) => {
    const [from, to] = [edges[k], edges[k + 1]];
    return from === undefined || to === undefined ? [] : [{ from, to, count }];
  });
  const rows = bins.map(({ from, to, count }) => ({
    bin: `${from.toFixed(2)}–${to.toFixed(2)}`,
    mid: (from + to) / 2,
    count,
  }));
  return (
    <PlotFrame
      title={`Nearest-neighbour distances, ${code}`}
      name={`nn-histogram-${code}`}
      height={220}
      csv={() => bins.map(({ from, to, count }) => ({ from_m: from, to_m: to, finds: count }))}
      caption={`Mean ${t.meanNN.toFixed(3)} m; under CSR in this trench ${t.expectedNN.toFixed(3)} m; R = ${t.R.toFixed(3)}.`}
    >
      <ResponsiveContainer width="100%" height={220}>
        <BarChart data={rows} margin={{ top: 8, right: 12, bottom: 18, left: 8 }}>
          <CartesianGrid stroke="#e6dcc8" />
          <XAxis
            dataKey="bin"
            interval="preserveStartEnd"
            label={{ value: "distance to nearest find (m)", position: "insideBottom", offset: -10 }}
            stroke="#5a4632"
            tick={{ fontSize: 10 }}
          />
          <YAxis allowDecimals={false} width={40} stroke="#5a4632" />
          <Bar dataKey="count" fill={colour} stroke="#2e2116" isAnimationActive={false} name="Finds" />
          <Tooltip />
        </BarChart>
      </ResponsiveContainer>
    </PlotFrame>
  );
}
