"use client";

import type { ClassInScope, RunResult } from "@/lib/api/run-result";
import type { TestView } from "@/lib/patterns-view/test-view";
import { NnHistogram } from "./bar-plots";
import { QuadratMap } from "./quadrat-map";
import { CurvePlot } from "./curve-plot";

/** The figures of one test, if it has any. */
export function TestFigure({
  t,
  result,
  cls,
  name,
}: {
  t: TestView;
  result: RunResult;
  cls?: ClassInScope;
  name: (id: string) => string;
}) {
  const code = cls?.code ?? "";
  const colour = cls?.colour ?? "#1d5c8c";
  const band = `Grey band: pointwise envelope of ${result.nsim} simulations (a picture, not the test; the verdict uses the global test).`;
  switch (t.kind) {
    case "l-envelope":
      return (
        <CurvePlot
          title={`L(r) − r, ${code}`}
          name={`l-minus-r-${code}`}
          curve={t.curve}
          yLabel="L(r) − r (m)"
          theoLabel="CSR (0)"
          colour={colour}
          departures={t.departures}
          caption={`${band} Above 0: more neighbours than CSR (clustering); below: fewer (regularity).`}
        />
      );
    case "inhomogeneous-l":
      return (
        <CurvePlot
          title={`Inhomogeneous L(r) − r, ${code}`}
          name={`l-inhom-${code}`}
          curve={t.curve}
          yLabel="L_inhom(r) − r (m)"
          theoLabel="Inhomogeneous Poisson (0)"
          colour={colour}
          departures={t.departures}
          caption={band}
        />
      );
    case "pcf-envelope":
      return (
        <CurvePlot
          title={`Pair correlation g(r), ${code}`}
          name={`pcf-${code}`}
          curve={t.curve}
          yLabel="g(r)"
          theoLabel="CSR (1)"
          colour={colour}
          caption={`${band} g > 1: pairs at that distance more common than under CSR.`}
        />
      );
    case "cross-l":
      if (t.fun === "K")
        return (
          <CurvePlot
            title={`Cross-K(r), ${name(t.a)} → ${name(t.b)}`}
            name={`cross-k-${name(t.a)}-${name(t.b)}-${t.null}`}
            curve={t.curve}
            yLabel="K_AB(r) (m²)"
            theoLabel={t.null === "random-labelling" ? "Mean under random labelling" : "CSR for B (πr²)"}
            colour={colour}
            departures={t.departures}
            caption={band}
          />
        );
      return (
        <CurvePlot
          title={`Cross-L(r) − r, ${name(t.a)} → ${name(t.b)}`}
          name={`cross-l-${name(t.a)}-${name(t.b)}-${t.null}`}
          curve={t.curve}
          yLabel="L_AB(r) − r (m)"
          theoLabel={t.null === "random-labelling" ? "Mean under random labelling" : "CSR for B (0)"}
          colour={colour}
          departures={t.departures}
          caption={band}
        />
      );
    case "k-difference":
      return (
        <CurvePlot
          title={`K difference K_${name(t.a)} − K_${name(t.b)}`}
          name={`k-difference-${name(t.a)}-${name(t.b)}`}
          curve={t.curve}
          yLabel="K_AA − K_BB (m²)"
          theoLabel="Mean under random labelling"
          colour={colour}
          departures={t.departures}
          caption={band}
        />
      );
    case "clark-evans":
      return <NnHistogram t={t} code={code} colour={colour} />;
    case "quadrat":
      return <QuadratMap t={t} code={code} outline={result.outline} />;
  }
}
