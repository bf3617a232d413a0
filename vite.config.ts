/// <reference types="vitest/config" />
import { fileURLToPath } from "node:url";
import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";

const alias = {
  "@": fileURLToPath(new URL("./src", import.meta.url)),
  "@server": fileURLToPath(new URL("./server", import.meta.url)),
  "@shared": fileURLToPath(new URL("./shared", import.meta.url)),
};

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  server: {
    host: "127.0.0.1",
    port: 5173,
    proxy: { "/api": "http://127.0.0.1:3000" },
  },
  build: { outDir: "dist", sourcemap: true },
  test: {
    reporters: process.env.CI ? ["default", ["json", { outputFile: process.env.VITEST_REPORT_FILE ?? ".data/vitest-report.json" }]] : ["default"],
    projects: [
      {
        extends: true,
        test: { name: "shared", include: ["tests/shared/**/*.test.ts"], environment: "node", testTimeout: 30_000, setupFiles: ["tests/setup/fast-check.ts"] },
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
        test: { name: "client", include: ["tests/client/**/*.test.tsx"], environment: "jsdom" },
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
