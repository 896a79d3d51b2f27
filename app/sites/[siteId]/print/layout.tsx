import type { ReactNode } from "react";
import "./print.css";

/** The printed registers share one print style sheet; the site's layout above already checked membership. */
export default function PrintLayout({ children }: { children: ReactNode }) {
  return children;
}
