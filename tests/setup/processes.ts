/** Helpers for process-level tests: free ports, child processes running TypeScript, waiting. */
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { pathToFileURL } from "node:url";

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

export interface Child {
  proc: ChildProcess;
  /** Everything the child printed so far (stdout and stderr). */
  output: () => string;
  alive: () => boolean;
  /** Resolves when the child has exited. */
  exited: Promise<number | null>;
}

/**
 * Runs a TypeScript file (or `-e` code) in one child process with tsx's loader (not tsx's CLI, which
 * would run the program in a grandchild that a SIGKILL of the child leaves running).
 */
export function spawnTsx(args: string[], env: NodeJS.ProcessEnv, cwd = process.cwd()): Child {
  const loader = pathToFileURL(path.resolve("node_modules/tsx/dist/loader.mjs")).href;
  const proc = spawn(process.execPath, ["--import", loader, ...args], { env, cwd, stdio: ["ignore", "pipe", "pipe"] });
  let out = "";
  proc.stdout?.on("data", (d) => (out += d));
  proc.stderr?.on("data", (d) => (out += d));
  const exited = new Promise<number | null>((resolve) => proc.once("exit", (code) => resolve(code)));
  return { proc, output: () => out, alive: () => proc.exitCode === null && proc.signalCode === null, exited };
}

/** Polls `check` until it returns a value other than undefined/false, or fails after `ms`. */
export async function waitFor<T>(
  what: string,
  check: () => Promise<T | undefined | false> | T | undefined | false,
  ms = 60_000,
  every = 200,
): Promise<T> {
  const deadline = Date.now() + ms;
  let lastErr: unknown;
  for (;;) {
    try {
      const v = await check();
      if (v !== undefined && v !== false) return v as T;
    } catch (err) {
      lastErr = err;
    }
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}${lastErr ? `: ${String(lastErr)}` : ""}`);
    await new Promise((r) => setTimeout(r, every));
  }
}

/** An environment for a child server: the parent's, minus what tests set for themselves. */
export function childEnv(extra: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const k of Object.keys(env)) if (k.startsWith("VITEST") || k === "TEST") delete env[k];
  return { ...env, ...extra };
}
