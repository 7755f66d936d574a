// Builds the service worker after `next build` (issue 20). Next 16 builds with Turbopack, which
// does not run @serwist/next's webpack plugin, so this is Serwist's own build step: esbuild
// bundles app/sw.ts, then @serwist/build's injectManifest writes the precache manifest (Next's
// hashed static files, the /offline page, the web manifest, the icons) into it. The result
// lives in the build directory (<distDir>/sw/sw.js, NEXT_DIST_DIR or .next) and is served at
// /sw.js by app/sw.js/route.ts, so two builds side by side never share one file.
//   node --import tsx scripts/build-sw.ts
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { build } from "esbuild";
import { injectManifest } from "@serwist/build";

async function main() {
  const root = path.resolve(import.meta.dirname, "..");
  const dist = path.resolve(root, process.env.NEXT_DIST_DIR || ".next");
  const buildIdFile = path.join(dist, "BUILD_ID");
  if (!existsSync(buildIdFile)) throw new Error(`${dist} holds no production build (no BUILD_ID): run next build first`);
  const buildId = readFileSync(buildIdFile, "utf8").trim();
  const outDir = path.join(dist, "sw");
  mkdirSync(outDir, { recursive: true });
  const bundled = path.join(outDir, "sw.bundle.js");
  await build({
    entryPoints: [path.join(root, "app/sw.ts")],
    outfile: bundled,
    bundle: true,
    format: "esm",
    target: "es2022",
    minify: true,
    sourcemap: false,
    define: { "process.env.NODE_ENV": '"production"' },
    logLevel: "warning",
  });
  const hash = (file: string) => createHash("sha256").update(readFileSync(file)).digest("hex").slice(0, 16);
  const pub = path.join(root, "public");
  const publicEntries = [
    { url: "/favicon.ico", revision: hash(path.join(pub, "favicon.ico")) },
    ...readdirSync(path.join(pub, "icons")).map((f) => ({ url: `/icons/${f}`, revision: hash(path.join(pub, "icons", f)) })),
  ];
  const result = await injectManifest({
    swSrc: bundled,
    swDest: path.join(outDir, "sw.js"),
    globDirectory: dist,
    // The app shell: Next's hashed JavaScript, CSS and the shipped Manrope fonts.
    globPatterns: ["static/**/*.{js,css,woff2}"],
    globIgnores: ["static/development/**", "**/*.map"],
    modifyURLPrefix: { "static/": "/_next/static/" },
    // Hashed names never change content: no revision needed.
    dontCacheBustURLsMatching: /^\/_next\/static\//,
    maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
    additionalPrecacheEntries: [
      { url: "/offline", revision: buildId },
      { url: "/manifest.webmanifest", revision: hash(path.join(root, "app/manifest.ts")) },
      ...publicEntries,
    ],
  });
  for (const w of result.warnings) console.warn(`[build-sw] ${w}`);
  console.log(`[build-sw] ${path.relative(root, path.join(outDir, "sw.js"))}: ${result.count} files precached (${Math.round(result.size / 1024)} kB)`);
}

main().catch((err) => {
  console.error(`[build-sw] ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
