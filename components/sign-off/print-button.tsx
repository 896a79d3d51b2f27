"use client";

export function PrintButton() {
  return <button className="btn-primary no-print" onClick={() => window.print()}>Print the trench record</button>;
}
