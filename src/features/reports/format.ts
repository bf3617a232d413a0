// Money and dates as the Reports screen shows them. One small place, to be replaced by the app's
// shared formatter when there is one.
import { dayLabel } from "@shared/domain/reports/day-label";

const moneyFormats = new Map<string, Intl.NumberFormat>();

/** Cents in the production's currency as "£1,234.50". */
export function formatMoney(cents: number, currency: string): string {
  let f = moneyFormats.get(currency);
  if (!f) {
    f = new Intl.NumberFormat("en-GB", { style: "currency", currency });
    moneyFormats.set(currency, f);
  }
  return f.format(cents / 100);
}

/** A calendar day (YYYY-MM-DD) as "Tue 8 Dec 2026", the same words the printed reports use. */
export const formatDay = dayLabel;

/** Bytes as "1.2 MB". */
export function formatBytes(n: number): string {
  return n >= 1048576 ? `${(n / 1048576).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} kB`;
}
