// When to try a failed send again. Exponential backoff with "equal jitter": the wait doubles from
// 2 s up to 5 minutes, and half of it is random so phones that lose the same signal do not all
// come back at the same second (Brooker, "Exponential Backoff And Jitter", AWS Architecture Blog, 2015).

export const RETRY_BASE_MS = 2_000;
export const RETRY_CAP_MS = 5 * 60_000;

/**
 * The wait before the next attempt after `failures` failed sends (1 = the first failure).
 * @param random a number in [0, 1) (Math.random by default; fixed in tests)
 */
export function retryDelayMs(failures: number, random: () => number = Math.random): number {
  const ceiling = Math.min(RETRY_CAP_MS, RETRY_BASE_MS * 2 ** Math.max(0, failures - 1));
  return Math.round(ceiling / 2 + random() * (ceiling / 2));
}
