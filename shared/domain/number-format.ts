// One way to print a number: thousands grouped, a stated precision kept (trailing zeros included, so
// the reader sees how precise it is), and the unit after it. Used wherever the same figure must read
// the same: the packet summary PDF and the Fabric physics table.

/** How many digits to show: a fixed number of decimals, or of significant digits. */
export type Precision = { decimals: number } | { significant: number };

const formatters = new Map<string, Intl.NumberFormat>();

function formatterFor(p: Precision): Intl.NumberFormat {
  const key = "decimals" in p ? `d${p.decimals}` : `s${p.significant}`;
  let f = formatters.get(key);
  if (!f) {
    f =
      "decimals" in p
        ? new Intl.NumberFormat("en-GB", { useGrouping: true, minimumFractionDigits: p.decimals, maximumFractionDigits: p.decimals })
        : new Intl.NumberFormat("en-GB", {
            useGrouping: true,
            minimumSignificantDigits: p.significant,
            maximumSignificantDigits: p.significant,
          });
    formatters.set(key, f);
  }
  return f;
}

/** A number with thousands grouped ("28,000", "0.250", "1,234.5"); −0 prints as 0. */
export function formatNumber(value: number, precision: Precision): string {
  if (!Number.isFinite(value)) return "—";
  const s = formatterFor(precision).format(value === 0 ? 0 : value);
  return s.replace(/^-(0(\.0+)?)$/, "$1");
}

/** A number and its unit: "28,000 N/m", "0.250 kg/m²", "12.5 mm". */
export function formatQuantity(value: number, unit: string, precision: Precision): string {
  return unit ? `${formatNumber(value, precision)} ${unit}` : formatNumber(value, precision);
}

/**
 * Half a unit in the last printed place: how far a printed figure may be from the value it stands for.
 * For significant digits this depends on the value's size (28,000 to 3 digits: ±50).
 */
export function printedHalfUnit(value: number, precision: Precision): number {
  if ("decimals" in precision) return 0.5 * 10 ** -precision.decimals;
  if (value === 0) return 0;
  const magnitude = Math.floor(Math.log10(Math.abs(Number(value.toPrecision(precision.significant)))));
  return 0.5 * 10 ** (magnitude - precision.significant + 1);
}
