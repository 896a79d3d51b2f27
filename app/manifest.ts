import type { MetadataRoute } from "next";

/** Loamwork as an installable app: opens on the sites list, full screen on a tablet or phone. */
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Loamwork — excavation notebook",
    short_name: "Loamwork",
    description: "Record where finds come out of the ground, on or off the network.",
    id: "/",
    start_url: "/sites",
    scope: "/",
    display: "standalone",
    orientation: "any",
    background_color: "#f7f2e8",
    theme_color: "#2e2116",
    icons: [
      { src: "/icons/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icons/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icons/maskable-192.png", sizes: "192x192", type: "image/png", purpose: "maskable" },
      { src: "/icons/maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
      { src: "/icons/loamwork.svg", sizes: "any", type: "image/svg+xml", purpose: "any" },
    ],
  };
}
