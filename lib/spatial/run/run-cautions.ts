/** The cautions every result carries (statistics.md, "What a result says"), and per-test notes. */
import type { TestSpec } from "./run-spec";

export const GENERAL_CAUTIONS = [
  "Equifinality: a pattern does not name the process that made it; clustering can come from deposition, from post-depositional movement or from how the trench was dug.",
  "The study area changes the answer: the test is only as right as the trench outline and the holes given as the window.",
  "Mixing contexts mixes moments in time: finds from several deposits tested together may show a pattern that no single deposit has.",
  "Fewer than about 20 points give little power: 'no evidence' from a small class is not evidence of randomness.",
];

export function testCautions(t: TestSpec, n: number): string[] {
  const out: string[] = [];
  if (n < 20) out.push(`Only ${n} points: the test has little power.`);
  const curve =
    t.type === "l-envelope" ||
    t.type === "pcf-envelope" ||
    t.type === "cross-l" ||
    t.type === "k-difference" ||
    t.type === "inhomogeneous-l";
  if (curve) {
    out.push(
      "The verdict rests on the global test's p-value. The pointwise band is a picture: a curve crossing it at some distance is not, by itself, significant.",
    );
    out.push(
      "The distances where the curve leaves the band and rejoins give a rough cluster diameter, which tends to overstate the size.",
    );
  }
  if (t.type === "cross-l" && t.null === "random-labelling") {
    out.push(
      "Random labelling asks whether the two classes are distributed alike over the find locations. When both lie in the same clusters the labels are exchangeable and it rightly finds nothing; the 'one class fixed' null asks about attraction.",
    );
  }
  if (t.type === "cross-l" && t.null === "a-fixed") {
    out.push(
      `Class ${t.a} fixed, class ${t.b} replaced by random positions: this asks whether ${t.b} finds lie nearer to ${t.a} finds than chance positions would. ${t.b}'s own clustering inflates this test.`,
    );
  }
  if (t.type === "inhomogeneous-l") {
    out.push(
      "The intensity is a kernel estimate read on a pixel image, not left out at each find: when the reference includes the tested class, its own finds raise the estimate where they lie, which makes the test conservative. The bandwidth changes the answer.",
    );
  }
  if (t.type === "clark-evans" && t.correction === "donnelly") {
    out.push(
      "Donnelly's correction was derived for rectangles; in an irregular trench it is an approximation — the Monte Carlo version is exact for any window.",
    );
  }
  if (t.type === "clark-evans" && t.correction === "none") {
    out.push(
      "Without an edge correction the Clark–Evans test is biased towards regularity near the trench edges; the Monte Carlo version is exact for any window.",
    );
  }
  return out;
}
