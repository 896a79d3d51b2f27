import { readdirSync } from "node:fs";
import path from "node:path";

/**
 * Every route file of the app (`page.tsx` or `route.ts`) as a URL path, sorted. `fill` gives the value of each
 * dynamic segment: called with the segment's name without brackets ("siteId"), or "..." for a catch-all.
 */
export function appRoutes(file: "page.tsx" | "route.ts", fill: (segment: string) => string): string[] {
  const root = path.resolve(import.meta.dirname, "../../app");
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      if (entry.isDirectory()) walk(path.join(dir, entry.name));
      else if (entry.name === file) {
        const segments = path.relative(root, dir).split(path.sep).filter(Boolean);
        out.push(
          "/" +
            segments
              .map((s) => (s.startsWith("[...") ? fill("...") : s.startsWith("[") ? fill(s.slice(1, -1)) : s))
              .join("/"),
        );
      }
    }
  };
  walk(root);
  return out.sort();
}
