"use client";

export function PrintButton({ label = "Print the trench record" }: { label?: string }) {
  return (
    <button className="btn-primary no-print" onClick={() => window.print()}>
      {label}
    </button>
  );
}
