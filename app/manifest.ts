import type { MetadataRoute } from "next";

// The web app manifest (issue 20): Gaffline installs to a phone's home screen and opens on the
// lineworker's My week (the start page of the other roles is one tap from it). Our own mark
// (public/icons, rendered by scripts/icons.ts) and the palette's ink and paper.
export default function manifest(): MetadataRoute.Manifest {
  return {
    id: "/",
    name: "Gaffline",
    short_name: "Gaffline",
    description: "Crew dispatch board for electric distribution line work; My week and the job briefing work without signal.",
    start_url: "/me",
    scope: "/",
    display: "standalone",
    orientation: "portrait",
    background_color: "#f6f4ef",
    theme_color: "#16232b",
    icons: [
      { src: "/icons/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icons/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icons/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
      { src: "/icons/icon.svg", sizes: "any", type: "image/svg+xml" },
    ],
  };
}
