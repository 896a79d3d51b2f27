import localFont from "next/font/local";

/** Shipped with the app (fonts/); nothing is fetched at build or run time. */
export const serif = localFont({
  variable: "--font-serif",
  display: "swap",
  src: [
    { path: "../fonts/source-serif-4-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../fonts/source-serif-4-latin-400-italic.woff2", weight: "400", style: "italic" },
    { path: "../fonts/source-serif-4-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "../fonts/source-serif-4-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
});

export const mono = localFont({
  variable: "--font-mono",
  display: "swap",
  src: [
    { path: "../fonts/ibm-plex-mono-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../fonts/ibm-plex-mono-latin-600-normal.woff2", weight: "600", style: "normal" },
  ],
});
