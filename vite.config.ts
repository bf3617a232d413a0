/// <reference types="vitest/config" />
import { fileURLToPath } from "node:url";
import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { VitePWA } from "vite-plugin-pwa";
import { keepOfflineEntries } from "./scripts/lib/precache.js";

const alias = {
  "@": fileURLToPath(new URL("./src", import.meta.url)),
  "@server": fileURLToPath(new URL("./server", import.meta.url)),
  "@shared": fileURLToPath(new URL("./shared", import.meta.url)),
};

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Installable app: the manifest, and our own service worker (src/sw.ts) with the precache list
    // injected. Only what the set's screens need offline is precached (see globPatterns); the
    // budget is checked by `npm run bench`.
    VitePWA({
      strategies: "injectManifest",
      srcDir: "src",
      filename: "sw.ts",
      registerType: "prompt",
      injectRegister: false,
      manifest: {
        name: "Seamscene",
        short_name: "Seamscene",
        description: "Costume continuity, wardrobe and workroom for film, series and stage.",
        start_url: "/",
        scope: "/",
        display: "standalone",
        orientation: "any",
        theme_color: "#2B3A67",
        background_color: "#F7F4EE",
        icons: [
          { src: "/icon-192.png", sizes: "192x192", type: "image/png" },
          { src: "/icon-512.png", sizes: "512x512", type: "image/png" },
          { src: "/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
          { src: "/favicon.svg", sizes: "any", type: "image/svg+xml" },
        ],
      },
      injectManifest: {
        globPatterns: ["**/*.{js,css,html,svg,png,woff2,webmanifest}"],
        globIgnores: ["sw.js", "**/*.map"],
        // Keep the shell and the set's screens; the office screens load from the network.
        manifestTransforms: [
          async (entries) => ({ manifest: keepOfflineEntries(entries, fileURLToPath(new URL("./dist", import.meta.url))), warnings: [] }),
        ],
      },
      devOptions: { enabled: false },
    }),
  ],
  resolve: { alias },
  server: {
    host: "127.0.0.1",
    port: 5173,
    proxy: { "/api": "http://127.0.0.1:3000" },
  },
  // The manifest lets the precache list follow the module graph (see precacheFilter).
  build: { outDir: "dist", sourcemap: true, manifest: true },
  test: {
    reporters: process.env.CI
      ? ["default", ["json", { outputFile: process.env.VITEST_REPORT_FILE ?? ".data/vitest-report.json" }]]
      : ["default"],
    projects: [
      {
        extends: true,
        test: {
          name: "shared",
          include: ["tests/shared/**/*.test.ts"],
          environment: "node",
          testTimeout: 30_000,
          setupFiles: ["tests/setup/fast-check.ts"],
        },
      },
      {
        extends: true,
        test: {
          name: "server",
          include: ["tests/server/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-setup.ts"],
          setupFiles: ["tests/setup/server-setup.ts", "tests/setup/fast-check.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: { name: "client", include: ["tests/client/**/*.test.{ts,tsx}"], environment: "jsdom" },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/e2e-setup.ts"],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // A loaded CI machine can take seconds to re-render after a request; 1 s (the default) is too tight.
          expect: { poll: { timeout: 20_000, interval: 100 } },
        },
      },
    ],
  },
});
