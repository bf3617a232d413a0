// Worker-thread entry for the heavy-work pool (server/lib/worker-pool.ts). The server runs from
// TypeScript sources, so the tasks are loaded through tsx's loader, scoped to this import, with the
// repository's tsconfig (its path aliases) whatever the working directory.
import { fileURLToPath } from "node:url";
import { tsImport } from "tsx/esm/api";

const tasks = await tsImport("./heavy-tasks.ts", {
  parentURL: import.meta.url,
  tsconfig: fileURLToPath(new URL("../../tsconfig.json", import.meta.url)),
});

export const readDxf = tasks.readDxf;
export const buildPacketZip = tasks.buildPacketZip;
