// React bindings of the offline queue and packs.
import { useEffect, useState, useSyncExternalStore } from "react";
import { useQueryClient } from "@tanstack/react-query";
import type { OfflinePackDto } from "@shared/schemas/offline";
import { queueRunner, type QueueState } from "./runner";
import { getPack, onPackChange } from "./store";

/** The queue of this account on this device: what waits, what is on its way, whether online. */
export function useOfflineQueue(): QueueState {
  return useSyncExternalStore(queueRunner.subscribe, queueRunner.getState, queueRunner.getState);
}

/**
 * Keeps the queue moving for the signed-in account, and refreshes the screens' data when a queued
 * record reaches the server.
 */
export function useQueueRunner(userId: string | undefined): void {
  const qc = useQueryClient();
  useEffect(() => {
    if (!userId) return;
    queueRunner.start(userId);
    return queueRunner.onSent((r) => {
      void qc.invalidateQueries({ queryKey: [r.kind === "continuity" ? "breakdown" : "garments", r.productionId] });
    });
  }, [userId, qc]);
}

/** The pack this device keeps for the account and production (undefined: none, or still reading). */
export function useSavedPack(userId: string | undefined, productionId: string): OfflinePackDto | undefined {
  const [pack, setPack] = useState<OfflinePackDto | undefined>();
  useEffect(() => {
    if (!userId || !productionId) return;
    let live = true;
    const read = () =>
      void getPack(userId, productionId)
        .then((p) => live && setPack(p))
        .catch(() => undefined);
    read();
    const off = onPackChange(read);
    return () => {
      live = false;
      off();
    };
  }, [userId, productionId]);
  return pack;
}
