import type { LabelItem } from "@/lib/server/labels";
import { labelPosition, perSheet, type LabelLayout } from "@/lib/labels/layout";
import { qrPath } from "@/lib/labels/qr";

/** One label: the QR code on the left, the record in words on the right, sized from the label's height. */
function Label({ item, layout, siteCode }: { item: LabelItem; layout: LabelLayout; siteCode: string }) {
  const qr = qrPath(item.code);
  const pad = Math.min(2, layout.heightMm * 0.06);
  const side = Math.min(layout.heightMm - 2 * pad, layout.widthMm * 0.45);
  const big = Math.min(layout.heightMm * 0.2, 7);
  const small = Math.max(1.8, Math.min(layout.heightMm * 0.085, 3.2));
  return (
    <div
      className="label-cell"
      style={{ width: `${layout.widthMm}mm`, height: `${layout.heightMm}mm`, padding: `${pad}mm`, gap: `${pad}mm` }}
      data-label-code={item.code}
    >
      <svg
        viewBox={`0 0 ${qr.size} ${qr.size}`}
        style={{ width: `${side}mm`, height: `${side}mm`, flex: "none" }}
        role="img"
        aria-label={`Code ${item.code}`}
        shapeRendering="crispEdges"
      >
        <rect width={qr.size} height={qr.size} fill="#fff" />
        <path d={qr.d} fill="#000" />
      </svg>
      <div className="min-w-0 overflow-hidden leading-tight" style={{ fontSize: `${small}mm` }}>
        <p className="font-mono font-bold" style={{ fontSize: `${big}mm` }}>
          {siteCode} {item.kindWord === "Find" ? "F" : "S"}
          {item.number}
        </p>
        <p>
          {item.kindWord} · trench {item.trenchCode} · context <span className="font-mono">{item.contextNumber}</span>
        </p>
        <p className="truncate">{item.what}</p>
        <p className="font-mono">{item.date}</p>
        <p className="truncate">{item.recorder}</p>
      </div>
    </div>
  );
}

/**
 * A4 sheets of labels laid out in millimetres exactly as they print (labels.css names the page with no
 * margin, so the sheet's own margins are the layout's). On screen each label is outlined.
 */
export function LabelSheets({
  items,
  layout,
  siteCode,
}: {
  items: LabelItem[];
  layout: LabelLayout;
  siteCode: string;
}) {
  const n = perSheet(layout);
  const sheets: LabelItem[][] = [];
  for (let i = 0; i < items.length; i += n) sheets.push(items.slice(i, i + n));
  return (
    <div className="label-sheets">
      {sheets.map((sheet, s) => (
        <section key={s} className="label-sheet" aria-label={`Sheet ${s + 1} of ${sheets.length}`}>
          {sheet.map((item, i) => {
            const at = labelPosition(layout, i);
            return (
              <div key={item.key} className="label-place" style={{ left: `${at.x}mm`, top: `${at.y}mm` }}>
                <Label item={item} layout={layout} siteCode={siteCode} />
              </div>
            );
          })}
        </section>
      ))}
    </div>
  );
}
