// Returns and wrap, and the budget: garments with their costs, hires and where they are, read with
// one query per table and summed by the pure functions in shared/domain/reports.
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { Production } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { productionToday } from "../lib/clock.js";
import type { Actor } from "../middleware/require-auth.js";
import { centsToUnits, garmentCost, groupCosts, rentalWeeks, type CostShare, type HirePeriod } from "@shared/domain/reports/money.js";
import { daysOverdue, groupRentalsByVendor, wrapAction, wrapActionLabels } from "@shared/domain/reports/returns.js";
import { DEFAULT_CURRENCY } from "@shared/schemas/productions.js";
import { garmentStatusLabels, type GarmentSource, type GarmentStatus, type WrapDisposition } from "@shared/schemas/garments.js";
import type {
  BudgetDto,
  BudgetGarmentDto,
  LostLineDto,
  OutLineDto,
  RentalLineDto,
  ReturnsDto,
  WrapAction,
  WrapLineDto,
} from "@shared/schemas/reports.js";
import type { Column, Sheet } from "../lib/tabular.js";

interface GarmentRow {
  id: string;
  tag_code: string;
  name: string;
  category: string;
  source: GarmentSource;
  vendor: string | null;
  cost_cents: number | null;
  rental_cost_per_week_cents: number | null;
  rental_due_on: string | null;
  status: GarmentStatus;
  location_rack: string | null;
  location_bin: string | null;
  wrap_disposition: WrapDisposition | null;
  /** Date and actor of the newest status change. */
  status_since: string | null;
  status_by: string | null;
  /** Date it went back to the hire house (newest move to "returned"). */
  returned_on: string | null;
}

async function loadGarments(productionId: string): Promise<GarmentRow[]> {
  return sequelize.query<GarmentRow>(
    `SELECT g.id, g.tag_code, g.name, g.category, g.source, g.vendor, g.cost_cents, g.rental_cost_per_week_cents,
            to_char(g.rental_due_on, 'YYYY-MM-DD') AS rental_due_on, g.status, g.location_rack, g.location_bin, g.wrap_disposition,
            to_char(last.created_at, 'YYYY-MM-DD') AS status_since, u.name AS status_by,
            (SELECT to_char(max(r.created_at), 'YYYY-MM-DD') FROM garment_status_events r WHERE r.garment_id = g.id AND r.to_status = 'returned') AS returned_on
       FROM garments g
       LEFT JOIN LATERAL (SELECT e.created_at, e.actor_id FROM garment_status_events e WHERE e.garment_id = g.id ORDER BY e.created_at DESC, e.id DESC LIMIT 1) last ON true
       LEFT JOIN users u ON u.id = last.actor_id
      WHERE g.production_id = :pid
      ORDER BY g.tag_code`,
    { replacements: { pid: productionId }, type: QueryTypes.SELECT },
  );
}

/** Currency, today and the hire period (the production's dates, else its first and last shoot days). */
async function moneyContext(productionId: string): Promise<{ currency: string; today: string; period: HirePeriod; title: string }> {
  const p = await Production.findByPk(productionId);
  if (!p) throw NotFoundError("Production not found.");
  const [span] = await sequelize.query<{ first: string | null; last: string | null }>(
    `SELECT to_char(min(date), 'YYYY-MM-DD') AS first, to_char(max(date), 'YYYY-MM-DD') AS last FROM shoot_days WHERE production_id = :pid`,
    { replacements: { pid: productionId }, type: QueryTypes.SELECT },
  );
  return {
    currency: p.settings?.currency ?? DEFAULT_CURRENCY,
    today: productionToday(p),
    period: { from: p.startsOn ?? span?.first ?? null, to: p.endsOn ?? span?.last ?? null },
    title: p.title,
  };
}

const location = (g: GarmentRow) => [g.location_rack, g.location_bin].filter(Boolean).join(" / ") || null;
const toFacts = (g: GarmentRow) => ({
  source: g.source,
  costCents: g.cost_cents,
  rentalCostPerWeekCents: g.rental_cost_per_week_cents,
  rentalDueOn: g.rental_due_on,
  returnedOn: g.returned_on,
});

/** Statuses that mean "out of the store with someone" (not on a rack, not gone for good). */
const OUT_STATUSES: ReadonlySet<GarmentStatus> = new Set(["on_set", "fitting", "cleaning", "workroom"]);

/**
 * Garments out of the store: where they went, since when, who moved them. Check-out does not yet
 * record the person who holds a garment or when it is due back; `holder` and `dueBack` stay empty
 * until it does (this is the one place to fill them in).
 */
export function garmentsOut(rows: GarmentRow[]): OutLineDto[] {
  return rows
    .filter((g) => OUT_STATUSES.has(g.status))
    .map((g) => ({
      garmentId: g.id,
      tagCode: g.tag_code,
      name: g.name,
      status: g.status,
      since: g.status_since,
      movedBy: g.status_by,
      holder: null,
      dueBack: null,
    }))
    .sort((a, b) => (a.since ?? "").localeCompare(b.since ?? "") || a.tagCode.localeCompare(b.tagCode));
}

/** Rentals by hire house (overdue first), lost items, garments out, and the wrap plan. */
export async function returnsReport(actor: Actor): Promise<ReturnsDto> {
  const [ctx, rows] = await Promise.all([moneyContext(actor.productionId), loadGarments(actor.productionId)]);
  const rentals: RentalLineDto[] = rows
    .filter((g) => g.source === "rented" && g.status !== "returned")
    .map((g) => {
      const over = daysOverdue(g.rental_due_on, ctx.today);
      const cost = garmentCost(toFacts(g), ctx.period);
      return {
        garmentId: g.id,
        tagCode: g.tag_code,
        name: g.name,
        category: g.category,
        vendor: g.vendor,
        status: g.status,
        location: location(g),
        dueOn: g.rental_due_on,
        daysOverdue: over,
        overdue: over !== null && over > 0,
        weeklyCents: g.rental_cost_per_week_cents,
        weeks: cost.weeks,
        hireCents: cost.totalCents,
      };
    });
  const lost: LostLineDto[] = rows
    .filter((g) => g.status === "lost")
    .map((g) => ({
      garmentId: g.id,
      tagCode: g.tag_code,
      name: g.name,
      source: g.source,
      vendor: g.vendor,
      lostOn: g.status_since,
      costCents: g.cost_cents,
    }));
  const wrap: WrapLineDto[] = rows
    .filter((g) => g.status !== "returned" && g.status !== "lost")
    .map((g) => ({
      garmentId: g.id,
      tagCode: g.tag_code,
      name: g.name,
      category: g.category,
      source: g.source,
      vendor: g.vendor,
      status: g.status,
      action: wrapAction(g.source, g.wrap_disposition),
      dueOn: g.source === "rented" ? g.rental_due_on : null,
      costCents: g.cost_cents,
    }));
  const order: WrapAction[] = ["return", "sell", "keep", "undecided"];
  wrap.sort(
    (a, b) =>
      order.indexOf(a.action) - order.indexOf(b.action) ||
      (a.dueOn ?? "").localeCompare(b.dueOn ?? "") ||
      a.tagCode.localeCompare(b.tagCode),
  );
  const wrapCounts = Object.fromEntries(order.map((a) => [a, wrap.filter((w) => w.action === a).length])) as Record<WrapAction, number>;
  return {
    today: ctx.today,
    currency: ctx.currency,
    rentals: groupRentalsByVendor(rentals),
    lost,
    out: garmentsOut(rows),
    wrap,
    wrapCounts,
  };
}

/** Costs by category, character, change and source, rental cost per week, and every garment's line. */
export async function budgetReport(actor: Actor): Promise<BudgetDto> {
  const rep = { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT } as const;
  const [ctx, rows, uses] = await Promise.all([
    moneyContext(actor.productionId),
    loadGarments(actor.productionId),
    // Which characters' changes use a garment: directly, or as any copy of a group the change names.
    sequelize.query<{
      garment_id: string;
      change_id: string;
      change_number: number;
      change_description: string | null;
      character_id: string;
      character_name: string;
    }>(
      `SELECT DISTINCT g.id AS garment_id, c.id AS change_id, c.number AS change_number, c.description AS change_description, ch.id AS character_id, ch.name AS character_name
         FROM change_items ci
         JOIN changes c ON c.id = ci.change_id
         JOIN characters ch ON ch.id = c.character_id
         JOIN garments g ON g.id = ci.garment_id OR (ci.multiples_group_id IS NOT NULL AND g.multiples_group_id = ci.multiples_group_id)
        WHERE ci.production_id = :pid`,
      rep,
    ),
  ]);
  const garments: BudgetGarmentDto[] = rows.map((g) => {
    const c = garmentCost(toFacts(g), ctx.period);
    return {
      garmentId: g.id,
      tagCode: g.tag_code,
      name: g.name,
      category: g.category,
      source: g.source,
      vendor: g.vendor,
      status: g.status,
      costCents: c.costCents,
      weeklyCents: c.weeklyCents,
      weeks: c.weeks,
      totalCents: c.totalCents,
    };
  });
  const usesOf = new Map<string, typeof uses>();
  for (const u of uses) (usesOf.get(u.garment_id) ?? usesOf.set(u.garment_id, []).get(u.garment_id)!).push(u);
  const uniq = (xs: CostShare[]) => [...new Map(xs.map((x) => [x.key, x])).values()];
  const sourceLabels: Record<GarmentSource, string> = { built: "Built", bought: "Bought", rented: "Rented" };
  return {
    currency: ctx.currency,
    hireFrom: ctx.period.from,
    hireTo: ctx.period.to,
    totalCents: garments.reduce((s, g) => s + g.totalCents, 0),
    groupings: {
      category: groupCosts(garments, (g) => [{ key: g.category, label: g.category }], { key: "", label: "" }),
      source: groupCosts(garments, (g) => [{ key: g.source, label: sourceLabels[g.source] }], { key: "", label: "" }),
      character: groupCosts(
        garments,
        (g) => uniq((usesOf.get(g.garmentId) ?? []).map((u) => ({ key: u.character_id, label: u.character_name }))),
        { key: "none", label: "Not in any change" },
      ),
      change: groupCosts(
        garments,
        (g) =>
          uniq(
            (usesOf.get(g.garmentId) ?? []).map((u) => ({
              key: u.change_id,
              label: `${u.character_name} · change ${u.change_number}${u.change_description ? ` (${u.change_description})` : ""}`,
            })),
          ),
        { key: "none", label: "Not in any change" },
      ),
    },
    rentalWeeks: rentalWeeks(garments, ctx.period.from),
    garments,
  };
}

// ---------------------------------------------------------------------------------------------------------
// Spreadsheet tables: numbers stay numbers (currency units with two decimals), dates stay text.

const money = (currency: string) => ({ numFmt: "#,##0.00", header: (h: string) => `${h} (${currency})` });

/** The returns report as tables (one per section). */
export function returnsSheets(r: ReturnsDto): Sheet[] {
  const m = money(r.currency);
  const rentals: Column<RentalLineDto & { vendorName: string }>[] = [
    { header: "Hire house", value: (l) => l.vendorName },
    { header: "Tag code", value: (l) => l.tagCode },
    { header: "Garment", value: (l) => l.name },
    { header: "Category", value: (l) => l.category },
    { header: "Status", value: (l) => garmentStatusLabels[l.status] },
    { header: "Where", value: (l) => l.location ?? "" },
    { header: "Due back", value: (l) => l.dueOn ?? "" },
    { header: "Days overdue", value: (l) => (l.overdue ? l.daysOverdue! : 0), numFmt: "0" },
    {
      header: m.header("Weekly rate"),
      value: (l) => (l.weeklyCents === null ? null : centsToUnits(l.weeklyCents)),
      numFmt: m.numFmt,
      sum: true,
    },
    { header: "Weeks", value: (l) => l.weeks, numFmt: "0" },
    { header: m.header("Hire cost"), value: (l) => centsToUnits(l.hireCents), numFmt: m.numFmt, sum: true },
  ];
  const lost: Column<LostLineDto>[] = [
    { header: "Tag code", value: (l) => l.tagCode },
    { header: "Garment", value: (l) => l.name },
    { header: "Source", value: (l) => l.source },
    { header: "Vendor / hire house", value: (l) => l.vendor ?? "" },
    { header: "Marked lost", value: (l) => l.lostOn ?? "" },
    { header: m.header("Cost"), value: (l) => (l.costCents === null ? null : centsToUnits(l.costCents)), numFmt: m.numFmt, sum: true },
  ];
  const out: Column<OutLineDto>[] = [
    { header: "Tag code", value: (l) => l.tagCode },
    { header: "Garment", value: (l) => l.name },
    { header: "Status", value: (l) => garmentStatusLabels[l.status] },
    { header: "Since", value: (l) => l.since ?? "" },
    { header: "Moved by", value: (l) => l.movedBy ?? "" },
    { header: "With", value: (l) => l.holder ?? "" },
    { header: "Due back", value: (l) => l.dueBack ?? "" },
  ];
  const wrap: Column<WrapLineDto>[] = [
    { header: "At wrap", value: (l) => wrapActionLabels[l.action] },
    { header: "Tag code", value: (l) => l.tagCode },
    { header: "Garment", value: (l) => l.name },
    { header: "Category", value: (l) => l.category },
    { header: "Source", value: (l) => l.source },
    { header: "Vendor / hire house", value: (l) => l.vendor ?? "" },
    { header: "Status", value: (l) => garmentStatusLabels[l.status] },
    { header: "Due back", value: (l) => l.dueOn ?? "" },
    { header: m.header("Cost"), value: (l) => (l.costCents === null ? null : centsToUnits(l.costCents)), numFmt: m.numFmt, sum: true },
  ];
  return [
    {
      name: "Rentals",
      columns: rentals as Column<unknown>[],
      rows: r.rentals.flatMap((v) => v.lines.map((l) => ({ ...l, vendorName: v.vendor }))),
      totals: true,
    },
    { name: "Lost", columns: lost as Column<unknown>[], rows: r.lost, totals: true },
    { name: "Out", columns: out as Column<unknown>[], rows: r.out },
    { name: "Wrap", columns: wrap as Column<unknown>[], rows: r.wrap, totals: true },
  ];
}

/** The budget as tables: every garment, each grouping, and rental cost per week. */
export function budgetSheets(b: BudgetDto): Sheet[] {
  const m = money(b.currency);
  const garments: Column<BudgetGarmentDto>[] = [
    { header: "Tag code", value: (g) => g.tagCode },
    { header: "Garment", value: (g) => g.name },
    { header: "Category", value: (g) => g.category },
    { header: "Source", value: (g) => g.source },
    { header: "Vendor / maker", value: (g) => g.vendor ?? "" },
    { header: "Status", value: (g) => garmentStatusLabels[g.status] },
    { header: m.header("Cost"), value: (g) => centsToUnits(g.costCents), numFmt: m.numFmt, sum: true },
    { header: m.header("Weekly hire"), value: (g) => centsToUnits(g.weeklyCents), numFmt: m.numFmt, sum: true },
    { header: "Weeks hired", value: (g) => g.weeks, numFmt: "0" },
    { header: m.header("Total"), value: (g) => centsToUnits(g.totalCents), numFmt: m.numFmt, sum: true },
  ];
  const grouping = (title: string): Column<{ label: string; cents: number; garments: number }>[] => [
    { header: title, value: (r) => r.label },
    { header: "Garments", value: (r) => r.garments, numFmt: "0.##", sum: true },
    { header: m.header("Total"), value: (r) => centsToUnits(r.cents), numFmt: m.numFmt, sum: true },
  ];
  const weeks: Column<BudgetDto["rentalWeeks"][number]>[] = [
    { header: "Week", value: (w) => w.week, numFmt: "0" },
    { header: "Starts", value: (w) => w.starts },
    { header: "Garments on hire", value: (w) => w.garments, numFmt: "0" },
    { header: m.header("Hire this week"), value: (w) => centsToUnits(w.cents), numFmt: m.numFmt, sum: true },
  ];
  return [
    { name: "Garments", columns: garments as Column<unknown>[], rows: b.garments, totals: true },
    { name: "By category", columns: grouping("Category") as Column<unknown>[], rows: b.groupings.category, totals: true },
    { name: "By character", columns: grouping("Character") as Column<unknown>[], rows: b.groupings.character, totals: true },
    { name: "By change", columns: grouping("Change") as Column<unknown>[], rows: b.groupings.change, totals: true },
    { name: "By source", columns: grouping("Source") as Column<unknown>[], rows: b.groupings.source, totals: true },
    { name: "Rental per week", columns: weeks as Column<unknown>[], rows: b.rentalWeeks, totals: true },
  ];
}
