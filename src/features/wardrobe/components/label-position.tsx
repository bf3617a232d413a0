/** Label positions on our A4 sheet of 3 × 8 labels, counted along each row from the top left. */
const POSITIONS = Array.from({ length: 24 }, (_, i) => i + 1);

/** Picks the first free label on a partly used sheet (1 = top left, counting along each row). */
export function LabelPositionSelect({ value, onChange }: { value: number; onChange: (n: number) => void }) {
  return (
    <label className="flex flex-col gap-1 text-sm font-semibold text-ink-900">
      Start at label
      <select
        className="min-h-11 rounded-md border border-ink-100 bg-white px-2 text-sm font-normal"
        value={value}
        onChange={(e) => onChange(Number(e.target.value))}
      >
        {POSITIONS.map((n) => (
          <option key={n} value={n}>
            {n} (row {Math.ceil(n / 3)}, column {((n - 1) % 3) + 1})
          </option>
        ))}
      </select>
    </label>
  );
}
