"use client";

import { shortcuts } from "./plan-toolbar";

export function HelpPanel({ onClose }: { onClose: () => void }) {
  return (
    <div role="dialog" aria-label="Keyboard shortcuts" className="space-y-3">
      <table className="ledger">
        <tbody>
          {shortcuts.map(([k, what]) => (
            <tr key={k}>
              <td className="num whitespace-nowrap font-bold">{k}</td>
              <td>{what}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-sm text-ink-soft">
        Pan with one finger or the mouse, zoom with two fingers or the wheel. Every tool also has a button; nothing
        depends on hovering.
      </p>
      <button type="button" className="btn" onClick={onClose}>
        Close
      </button>
    </div>
  );
}
