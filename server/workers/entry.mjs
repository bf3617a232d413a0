// Worker-thread entry for the heavy-work pool (server/lib/worker-pool.ts). The server runs from
// TypeScript sources, so the tasks are loaded through tsx's loader, scoped to this import.
import { tsImport } from "tsx/esm/api";

const tasks = await tsImport("./heavy-tasks.ts", import.meta.url);

export const readDxf = tasks.readDxf;
export const buildPacketZip = tasks.buildPacketZip;
