import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";

/** An artefact class's symbol in its colour, for legends, tables and reports. */
export function ClassSymbol({
  symbol,
  colour,
  size = 16,
  title,
}: {
  symbol: string;
  colour: string;
  size?: number;
  title?: string;
}) {
  const d = symbolPath[symbol as SymbolShape] ?? symbolPath.disc;
  return (
    <svg
      width={size}
      height={size}
      viewBox="-1.25 -1.25 2.5 2.5"
      role="img"
      aria-label={title ?? symbol}
      className="inline-block align-middle"
    >
      <path d={d} fill={colour} fillRule="evenodd" stroke="#2e2116" strokeWidth={0.18} />
    </svg>
  );
}
