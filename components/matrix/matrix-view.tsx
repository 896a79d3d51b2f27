import type { MatrixDrawing } from "@/lib/server/export/matrix-svg";

/**
 * The drawn matrix inline. The SVG is built on the server from escaped text only (matrix-svg.ts), so it
 * is safe to place as markup; each context number inside is a link to its sheet.
 */
export function MatrixView({ drawing }: { drawing: MatrixDrawing }) {
  return (
    <figure className="sheet overflow-auto" aria-label="Harris matrix diagram">
      <div style={{ width: drawing.width, height: drawing.height }} dangerouslySetInnerHTML={{ __html: drawing.svg }} />
      <figcaption className="mt-2 text-sm text-ink-soft">
        Latest at the top. Solid lines: relations the matrix needs; dashed: redundant relations, already implied by a
        longer chain. Contexts joined by “same as” share one box. A thick border marks a signed-off group.
      </figcaption>
    </figure>
  );
}
