// Keeps the signed-in account's queue moving: sends when the page opens, when something is queued,
// when the connection comes back, and when a backoff wait ends. One tab sends at a time (Web Locks
// where the browser has them); the server's client-id key makes a double send harmless anyway.
import type { QueuedItem } from "./db";
import { listQueue, onQueueChange } from "./queue";
import { sendWaiting, type SentRecord, type Transport } from "./sender";
import { sendQueuedItem } from "./transport";

export interface QueueState {
  userId: string | null;
  items: QueuedItem[];
  /** The record on its way to the server now. */
  sendingClientId: string | null;
  /** The session ended; sending waits until the person signs in again. */
  signInNeeded: boolean;
  online: boolean;
}

type Listener = () => void;
type SentListener = (r: SentRecord) => void;

const LOCK = "seamscene-offline-send";

/** The queue runner of this tab (one per page). */
export class QueueRunner {
  private state: QueueState = { userId: null, items: [], sendingClientId: null, signInNeeded: false, online: true };
  private listeners = new Set<Listener>();
  private sentListeners = new Set<SentListener>();
  private running = false;
  private again = false;
  private againForced = false;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private unsubscribe: (() => void) | null = null;
  private readonly onOnline = () => {
    this.set({ online: true });
    this.kick(true);
  };
  private readonly onOffline = () => this.set({ online: false });
  private readonly onVisible = () => {
    if (document.visibilityState === "visible") this.kick();
  };

  constructor(private readonly transport: Transport = sendQueuedItem) {}

  /** The current state (a new object after every change, for useSyncExternalStore). */
  getState = (): QueueState => this.state;

  subscribe = (fn: Listener): (() => void) => {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  };

  /** Called with each record the server stored. */
  onSent(fn: SentListener): () => void {
    this.sentListeners.add(fn);
    return () => this.sentListeners.delete(fn);
  }

  private set(patch: Partial<QueueState>): void {
    this.state = { ...this.state, ...patch };
    this.listeners.forEach((l) => l());
  }

  /** Starts working for a signed-in account (stops working for any other). */
  start(userId: string): void {
    if (this.state.userId === userId) return;
    this.stop();
    this.set({ userId, items: [], signInNeeded: false, online: typeof navigator === "undefined" ? true : navigator.onLine });
    this.unsubscribe = onQueueChange(() => void this.refresh());
    if (typeof window !== "undefined") {
      window.addEventListener("online", this.onOnline);
      window.addEventListener("offline", this.onOffline);
      document.addEventListener("visibilitychange", this.onVisible);
    }
    void this.refresh().then(() => this.kick());
  }

  /** Stops (signed out). Queued records stay on the device unless the sign-out deleted them. */
  stop(): void {
    this.unsubscribe?.();
    this.unsubscribe = null;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (typeof window !== "undefined") {
      window.removeEventListener("online", this.onOnline);
      window.removeEventListener("offline", this.onOffline);
      document.removeEventListener("visibilitychange", this.onVisible);
    }
    this.set({ userId: null, items: [], sendingClientId: null, signInNeeded: false });
  }

  /** Re-reads the queue from the device. */
  async refresh(): Promise<void> {
    const userId = this.state.userId;
    if (!userId) return;
    const items = await listQueue(userId);
    if (this.state.userId === userId) this.set({ items });
  }

  /** Sends what may be sent now; `force` skips the backoff wait. */
  kick(force = false): void {
    if (!this.state.userId) return;
    if (this.running) {
      this.again = true;
      this.againForced ||= force;
      return;
    }
    void this.run(force);
  }

  private async run(force: boolean): Promise<void> {
    const userId = this.state.userId;
    if (!userId) return;
    // The browser knows it has no network: wait for the "online" event instead of failing sends.
    if (typeof navigator !== "undefined" && navigator.onLine === false) return;
    this.running = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    try {
      const pass = () => sendWaiting({ userId, transport: this.transport, force, onSending: (id) => this.set({ sendingClientId: id }) });
      const locks = typeof navigator !== "undefined" ? navigator.locks : undefined;
      const report = locks ? await locks.request(LOCK, pass) : await pass();
      if (report.sent.length || report.held.length || report.signInNeeded !== this.state.signInNeeded)
        this.set({ signInNeeded: report.signInNeeded });
      for (const r of report.sent) this.sentListeners.forEach((l) => l(r));
      if (report.nextAttemptAt !== null) {
        const wait = Math.max(0, report.nextAttemptAt - Date.now());
        this.timer = setTimeout(() => this.kick(), wait);
      }
    } catch {
      // The device store itself failed (storage full, private mode): try again later.
      this.timer = setTimeout(() => this.kick(), 30_000);
    } finally {
      this.running = false;
      await this.refresh();
      if (this.again) {
        const f = this.againForced;
        this.again = false;
        this.againForced = false;
        this.kick(f);
      }
    }
  }
}

/** This page's runner. */
export const queueRunner = new QueueRunner();
