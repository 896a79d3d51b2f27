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
 * A box label: the code and the box in words along the top, then what the box holds, one find or sample a
 * line, in as many columns as the label's width allows. What does not fit is counted on the last line, so
 * the label never claims to list everything when it does not.
 */
function BoxLabel({ item, layout, siteCode }: { item: LabelItem; layout: LabelLayout; siteCode: string }) {
  const qr = qrPath(item.code);
  const pad = Math.min(2, layout.heightMm * 0.05);
  const side = Math.min(layout.heightMm * 0.38, layout.widthMm * 0.3, 24);
  const big = Math.min(side * 0.28, 6);
  const line = Math.max(2, Math.min(2.8, layout.heightMm * 0.05));
  const columns = Math.max(1, Math.floor((layout.widthMm - 2 * pad) / 32));
  const rows = Math.max(1, Math.floor((layout.heightMm - 3 * pad - side) / (line * 1.15)));
  const contents = item.contents ?? [];
  const room = rows * columns;
  const shown = contents.length > room ? contents.slice(0, room - 1) : contents;
  const rest = contents.length - shown.length;
  return (
    <div
      className="label-cell label-box"
      style={{ width: `${layout.widthMm}mm`, height: `${layout.heightMm}mm`, padding: `${pad}mm`, gap: `${pad}mm` }}
      data-label-code={item.code}
    >
      <div className="flex items-start" style={{ gap: `${pad}mm` }}>
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
        <div className="min-w-0 leading-tight" style={{ fontSize: `${line}mm` }}>
          <p className="font-mono font-bold" style={{ fontSize: `${big}mm` }}>
            {siteCode} Box {item.number}
          </p>
          <p className="truncate">{item.what || "Store not given"}</p>
          <p>
            {contents.length === 0 ? "Empty" : `${contents.length} ${contents.length === 1 ? "record" : "records"}`}
            {item.trenchCode ? ` · trench ${item.trenchCode}` : ""}
          </p>
        </div>
      </div>
      <ul
        className="label-box-contents font-mono"
        aria-label={`In box ${item.number}`}
        style={{ columnCount: columns, fontSize: `${line}mm`, lineHeight: 1.15 }}
      >
        {shown.map((c) => (
          <li key={c} className="truncate">
            {c}
          </li>
        ))}
        {rest > 0 && <li>… and {rest} more: see the box page</li>}
      </ul>
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
                {item.kindWord === "Box" ? (
                  <BoxLabel item={item} layout={layout} siteCode={siteCode} />
                ) : (
                  <Label item={item} layout={layout} siteCode={siteCode} />
                )}
              </div>
            );
          })}
        </section>
      ))}
    </div>
  );
}
