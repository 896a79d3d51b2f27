"use client";

import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ClarkEvansOut } from "@/lib/api/run-result";
import { PlotFrame } from "./plot-frame";

/** Nearest-neighbour distances of one class, binned. */
export function NnHistogram({ t, code, colour }: { t: ClarkEvansOut; code: string; colour: string }) {
  const { edges, counts } = t.histogram;
  const rows = counts.map((c, k) => ({
    bin: `${edges[k].toFixed(2)}–${edges[k + 1].toFixed(2)}`,
    mid: (edges[k] + edges[k + 1]) / 2,
    count: c,
  }));
  return (
    <PlotFrame
      title={`Nearest-neighbour distances, ${code}`}
      name={`nn-histogram-${code}`}
      height={220}
      csv={() => counts.map((c, k) => ({ from_m: edges[k], to_m: edges[k + 1], finds: c }))}
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
