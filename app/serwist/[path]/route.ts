import { createSerwistRoute } from "@serwist/turbopack";

/**
 * The service worker, bundled at build time from lib/offline/service-worker.ts with the list of the app's
 * own files to keep (/serwist/sw.js). Served with its own header set (next.config.ts), outside the pages' proxy.
 */
export const { dynamic, dynamicParams, revalidate, generateStaticParams, GET } = createSerwistRoute({
  swSrc: "lib/offline/service-worker.ts",
  useNativeEsbuild: true,
  // The app's own files only; icons and the drawing they are made from come along.
  globPatterns: [".next/static/**/*.{js,css,woff2}", "public/**/*.{png,svg}"],
});
