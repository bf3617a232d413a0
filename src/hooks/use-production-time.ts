import { formatDateOf, formatDateTime, formatTime, type Instant } from "@shared/format";
import { useCurrentProduction } from "./use-current-production";

/**
 * The production's time zone and today's date (from the server's clock), with formatters bound to that zone.
 * The client never takes "today" or a time zone from the browser.
 */
export function useProductionTime() {
  const { production } = useCurrentProduction();
  // Until the production has loaded nothing dated is on screen; UTC only keeps the formatters total.
  const timeZone = production?.timeZone ?? "UTC";
  return {
    timeZone,
    /** Today in the production's zone (YYYY-MM-DD), or "" before the production has loaded. */
    today: production?.today ?? "",
    /** "Thu 3 Dec 2026, 14:30" in the production's zone. */
    dateTime: (at: Instant) => formatDateTime(at, timeZone),
    /** "Thu 3 Dec 2026": the day an instant fell on in the production's zone. */
    dateOf: (at: Instant) => formatDateOf(at, timeZone),
    /** "14:30" in the production's zone. */
    time: (at: Instant) => formatTime(at, timeZone),
  };
}
