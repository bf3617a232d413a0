// The chart library is loaded only with this file (the Budget tab), not with the rest of the app.
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMoney } from "../format";

export interface ChartRow {
  label: string;
  cents: number;
}

/** A horizontal bar per group (the largest first), in the production's currency. */
export default function BudgetChart({ rows, currency, title }: { rows: ChartRow[]; currency: string; title: string }) {
  const data = rows
    .slice(0, 15)
    .map((r) => ({ label: r.label.length > 28 ? `${r.label.slice(0, 27)}…` : r.label, amount: r.cents / 100, cents: r.cents }));
  const height = Math.max(140, data.length * 28 + 40);
  return (
    <figure aria-label={title} className="w-full">
      <ResponsiveContainer width="100%" height={height}>
        <BarChart data={data} layout="vertical" margin={{ top: 4, right: 16, bottom: 4, left: 8 }}>
          <CartesianGrid horizontal={false} stroke="#E6E1D8" />
          <XAxis
            type="number"
            tickFormatter={(v: number) => formatMoney(v * 100, currency).replace(/\.00$/, "")}
            tick={{ fontSize: 11, fill: "#5B6770" }}
          />
          <YAxis type="category" dataKey="label" width={150} tick={{ fontSize: 11, fill: "#2B3A67" }} interval={0} />
          <Tooltip formatter={(v) => formatMoney(Number(v) * 100, currency)} cursor={{ fill: "#F7F4EE" }} />
          <Bar dataKey="amount" name="Cost" fill="#2B3A67" radius={[0, 3, 3, 0]} isAnimationActive={false} />
        </BarChart>
      </ResponsiveContainer>
      {rows.length > 15 && <figcaption className="text-xs text-slate">The 15 largest of {rows.length}; the table lists all.</figcaption>}
    </figure>
  );
}
