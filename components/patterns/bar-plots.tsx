"use client";

import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Scatter, ComposedChart, Tooltip, XAxis, YAxis } from "recharts";
import type { ClarkEvansOut, QuadratOut } from "@/lib/server/analysis/result-types";
import { PlotFrame } from "./plot-frame";

/** Nearest-neighbour distances of one class, binned. */
export function NnHistogram({ t, code, colour }: { t: ClarkEvansOut; code: string; colour: string }) {
  const { edges, counts } = t.histogram;
  const rows = counts.map((c, k) => ({ bin: `${edges[k].toFixed(2)}–${edges[k + 1].toFixed(2)}`, mid: (edges[k] + edges[k + 1]) / 2, count: c }));
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
          <XAxis dataKey="bin" interval="preserveStartEnd" label={{ value: "distance to nearest find (m)", position: "insideBottom", offset: -10 }} stroke="#5a4632" tick={{ fontSize: 10 }} />
          <YAxis allowDecimals={false} width={40} stroke="#5a4632" />
          <Bar dataKey="count" fill={colour} stroke="#2e2116" isAnimationActive={false} name="Finds" />
          <Tooltip />
        </BarChart>
      </ResponsiveContainer>
    </PlotFrame>
  );
}

/** Observed against expected count per quadrat, cells ordered by expected count. */
export function QuadratChart({ t, code, colour }: { t: QuadratOut; code: string; colour: string }) {
  const rows = t.cells.map((c, k) => ({ cell: k + 1, count: c.count, expected: Number(c.expected.toFixed(2)) }));
  return (
    <PlotFrame
      title={`Quadrat counts, ${code}`}
      name={`quadrat-${code}`}
      height={220}
      csv={() => t.cells.map((c, k) => ({ cell: k + 1, x0: c.x0, y0: c.y0, x1: c.x1, y1: c.y1, observed: c.count, expected: c.expected }))}
      caption={`X² = ${t.X2.toFixed(2)}, df = ${t.df}, variance/mean = ${t.vmr.toFixed(2)}${t.monteCarlo ? "; small expected counts, p by Monte Carlo" : ""}. Dots: expected from each cell's area inside the trench.`}
    >
      <ResponsiveContainer width="100%" height={220}>
        <ComposedChart data={rows} margin={{ top: 8, right: 12, bottom: 18, left: 8 }}>
          <CartesianGrid stroke="#e6dcc8" />
          <XAxis dataKey="cell" label={{ value: "cell", position: "insideBottom", offset: -10 }} stroke="#5a4632" />
          <YAxis allowDecimals={false} width={40} stroke="#5a4632" />
          <Bar dataKey="count" fill={colour} stroke="#2e2116" isAnimationActive={false} name="Observed" />
          <Scatter dataKey="expected" fill="#2e2116" isAnimationActive={false} name="Expected" />
          <Tooltip />
        </ComposedChart>
      </ResponsiveContainer>
    </PlotFrame>
  );
}
