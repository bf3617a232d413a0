/** Drawing units a DXF may use, with their size in millimetres (1 in = 25.4 mm and 1 ft = 304.8 mm exactly). */
export const DXF_UNITS = { mm: 1, cm: 10, m: 1000, in: 25.4, ft: 304.8 } as const;
export type DxfUnit = keyof typeof DXF_UNITS;
/** $INSUNITS codes of the DXF header that a pattern may use. */
export const INSUNITS: Readonly<Record<number, DxfUnit>> = { 1: "in", 2: "ft", 4: "mm", 5: "cm", 6: "m" };
