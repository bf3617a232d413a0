// Building an Intl.DateTimeFormat costs far more than using one (it was a few per cent of a list
// request's CPU); one per zone is kept. The set of zones in use is small (one per production).
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-CA", {
      timeZone,
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      hourCycle: "h23",
    });
    formatters.set(timeZone, f);
  }
  return f;
}

/** Calendar date and hour of an instant in a named time zone (Intl only; no extra package). */
export function zonedParts(instant: Date, timeZone: string): { date: string; hour: number; minute: number } {
  const parts = formatterFor(timeZone).formatToParts(instant);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? "00";
  return { date: `${get("year")}-${get("month")}-${get("day")}`, hour: Number(get("hour")), minute: Number(get("minute")) };
}

/**
 * The instant at which a zone's wall clock shows `date` (yyyy-MM-dd) at `time` (HH:mm): the first one in a
 * repeated hour; a time in a skipped hour is read an hour later.
 */
export function zonedInstant(date: string, time: string, timeZone: string): Date {
  const [y, mo, d] = date.split("-").map(Number) as [number, number, number];
  const [h, mi] = time.split(":").map(Number) as [number, number];
  const wanted = Date.UTC(y, mo - 1, d, h, mi);
  let t = wanted;
  // Two corrections settle the zone's offset, also across a daylight-saving change.
  for (let i = 0; i < 2; i++) {
    const p = zonedParts(new Date(t), timeZone);
    const [py, pmo, pd] = p.date.split("-").map(Number) as [number, number, number];
    t += wanted - Date.UTC(py, pmo - 1, pd, p.hour, p.minute);
  }
  return new Date(t);
}
