// Which built files the service worker precaches: the app shell and the screens a set costumer uses
// without a signal, found by walking Vite's module graph (hashed file names change every build).
import fs from "node:fs";
import path from "node:path";

/** The page modules that must open offline: Today, Continuity, Wardrobe (check in / out), sign-in and home. */
export const OFFLINE_SCREENS = [
  "src/app/routes/app/today.tsx",
  "src/app/routes/app/continuity.tsx",
  "src/app/routes/app/wardrobe.tsx",
  "src/app/routes/app/home.tsx",
  "src/app/routes/auth/login.tsx",
];

interface ViteManifestChunk {
  file: string;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
  assets?: string[];
}
type ViteManifest = Record<string, ViteManifestChunk>;

/** Reads `dist/.vite/manifest.json` (written because `build.manifest` is on). */
export function readViteManifest(distDir: string): ViteManifest {
  return JSON.parse(fs.readFileSync(path.join(distDir, ".vite", "manifest.json"), "utf8")) as ViteManifest;
}

/**
 * Files (relative to dist) the offline screens need: the entry with its static imports and CSS, each
 * offline screen with its imports, and what those screens load on demand (the camera's code reader).
 * Fonts: WOFF2 only (every browser that runs a service worker reads it), without the Vietnamese subset.
 */
export function offlineShellFiles(manifest: ViteManifest, screens: string[] = OFFLINE_SCREENS): Set<string> {
  const out = new Set<string>(["index.html"]);
  const seen = new Set<string>();
  const walk = (key: string, followDynamic: boolean) => {
    if (seen.has(key)) return;
    seen.add(key);
    const c = manifest[key];
    if (!c) return;
    out.add(c.file);
    for (const f of [...(c.css ?? []), ...(c.assets ?? [])]) out.add(f);
    for (const k of c.imports ?? []) walk(k, followDynamic);
    if (followDynamic) for (const k of c.dynamicImports ?? []) walk(k, followDynamic);
  };
  walk("index.html", false);
  for (const s of screens) {
    if (!manifest[s]) throw new Error(`The offline screen ${s} is not in the build; update OFFLINE_SCREENS.`);
    walk(s, true);
  }
  return new Set([...out].filter((f) => !/\.woff$/.test(f) && !/vietnamese/.test(f)));
}

/**
 * The precache entries workbox-build found, kept when the offline screens need them (the plugin adds
 * the web app manifest and its icons itself).
 */
export function keepOfflineEntries<T extends { url: string }>(entries: T[], distDir: string): T[] {
  const keep = offlineShellFiles(readViteManifest(distDir));
  return entries.filter((e) => keep.has(e.url));
}

/** The URLs written into the built service worker's precache list, with each file's size in bytes. */
export function precacheOf(distDir: string): Array<{ url: string; bytes: number }> {
  const sw = fs.readFileSync(path.join(distDir, "sw.js"), "utf8");
  const urls = [...sw.matchAll(/"url":"([^"]+)"/g)].map((m) => m[1]!);
  return [...new Set(urls)].map((url) => ({ url, bytes: fs.statSync(path.join(distDir, url.replace(/^\//, ""))).size }));
}
