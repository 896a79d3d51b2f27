/** A class's symbol in its colour, so colour is never the only cue (product.md "Look"). */
export function ClassMark({ symbol, colour, size = 14 }: { symbol: string; colour: string; size?: number }) {
  const c = { fill: colour, stroke: "#2e2116", strokeWidth: 0.8 };
  const shape: Record<string, React.ReactNode> = {
    disc: <circle cx="7" cy="7" r="5.5" {...c} />,
    square: <rect x="1.8" y="1.8" width="10.4" height="10.4" {...c} />,
    triangle: <path d="M7 1.2 L13 12.5 L1 12.5 Z" {...c} />,
    diamond: <path d="M7 0.8 L13.2 7 L7 13.2 L0.8 7 Z" {...c} />,
    cross: <path d="M5 1h4v4h4v4H9v4H5V9H1V5h4z" {...c} />,
    star: <path d="M7 0.8l1.9 4.1 4.4.5-3.3 3 .9 4.4L7 10.6 3.1 12.8 4 8.4.7 5.4l4.4-.5z" {...c} />,
    ring: <circle cx="7" cy="7" r="4.8" fill="none" stroke={colour} strokeWidth={2.6} />,
    bar: <rect x="1" y="4.5" width="12" height="5" {...c} />,
  };
  return (
    <svg aria-hidden width={size} height={size} viewBox="0 0 14 14" className="mr-1 inline-block align-[-2px]">
      {shape[symbol] ?? shape.disc}
    </svg>
  );
}
