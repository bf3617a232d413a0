// The pool of worker threads for CPU-heavy work (piscina). Requests hand work to it and wait on a
// promise, so the event loop keeps answering everyone else (health checks, photo serving, other
// users) while a large DXF is read or a packet is built.
import { MessageChannel } from "node:worker_threads";
import { Piscina } from "piscina";
import { config } from "../config.js";
import { ServerBusyError } from "../errors.js";
import type * as Tasks from "../workers/heavy-tasks.js";
import type { HeavyProgress } from "../workers/heavy-tasks.js";

type TaskName = "readDxf" | "buildPacketZip";
type TaskInput<N extends TaskName> = Parameters<(typeof Tasks)[N]>[0];
type TaskOutput<N extends TaskName> = Awaited<ReturnType<(typeof Tasks)[N]>>;

/** Tasks waiting beyond this many are refused with 503 rather than queued without end. */
const MAX_QUEUE = 64;

let pool: Piscina | null = null;

function thePool(): Piscina {
  pool ??= new Piscina({
    filename: new URL("../workers/entry.mjs", import.meta.url).href,
    minThreads: 1,
    maxThreads: config.WORKER_THREADS,
    // Idle workers stay a while: starting one loads the TypeScript sources (about half a second).
    idleTimeout: 5 * 60_000,
    maxQueue: MAX_QUEUE,
  });
  return pool;
}

/**
 * Runs a task in the worker pool.
 * @param options.onProgress called with the task's progress messages, if it sends any
 * @param options.transfer buffers moved to the worker instead of copied
 */
export async function runHeavy<N extends TaskName>(
  name: N,
  input: Omit<TaskInput<N>, "progress">,
  options: { onProgress?: (p: HeavyProgress) => void; transfer?: ArrayBuffer[] } = {},
): Promise<TaskOutput<N>> {
  const p = thePool();
  let channel: MessageChannel | null = null;
  let task: Record<string, unknown> = input as Record<string, unknown>;
  const transferList: Array<ArrayBuffer | MessageChannel["port2"]> = [...(options.transfer ?? [])];
  if (options.onProgress) {
    channel = new MessageChannel();
    const onProgress = options.onProgress;
    channel.port1.on("message", (m: HeavyProgress) => onProgress(m));
    task = { ...task, progress: channel.port2 };
    transferList.push(channel.port2);
  }
  try {
    return (await p.run(task, { name, transferList: transferList as never })) as TaskOutput<N>;
  } catch (err) {
    if (err instanceof Error && /queue is at limit/i.test(err.message)) throw ServerBusyError();
    throw err;
  } finally {
    channel?.port1.close();
  }
}

/** Stops the pool's threads (shutdown and tests). */
export async function closeWorkerPool(): Promise<void> {
  const p = pool;
  pool = null;
  await p?.destroy();
}
