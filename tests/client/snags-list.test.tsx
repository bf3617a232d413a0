import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import { SnagsList, groupSnags, type SnagFilters } from "@/features/snags/components/snags-list";
import type { SnagDto, SnagListDto } from "@shared/schemas/snags";

function snag(over: Partial<SnagDto>): SnagDto {
  return {
    key: "k",
    kind: "fit",
    severity: "warning",
    title: "t",
    explanation: "explained with numbers",
    evidence: {},
    evidenceHash: "00000000",
    subject: {},
    characters: [],
    garments: [],
    scenes: [],
    shootDays: [],
    group: null,
    links: [{ label: "Garment J-1", href: "/p/p1/wardrobe/garments/g1" }],
    dismissal: null,
    lapsedDismissal: null,
    ...over,
  };
}

const snags = [
  snag({ key: "a", severity: "note", title: "Loose coat", characters: [{ id: "c2", name: "Moss" }] }),
  snag({
    key: "b",
    severity: "blocking",
    kind: "multiples",
    title: "Oilskin short",
    shootDays: [{ id: "d1", date: "2027-01-11" }],
    characters: [{ id: "c1", name: "Wren" }],
  }),
  snag({
    key: "c",
    severity: "warning",
    title: "Tight jacket",
    evidence: { points: [{ point: "chest", ease: 10, min: 38.1, status: "tight", by: 28.1 }] },
    characters: [{ id: "c1", name: "Wren" }],
  }),
];

const data: SnagListDto = {
  today: "2027-01-10",
  nextShootDay: { id: "d1", date: "2027-01-11", kind: "shoot" },
  snags,
  counts: {
    total: 3,
    dismissed: 0,
    lapsed: 0,
    bySeverity: { blocking: 1, warning: 1, note: 1 },
    byKind: {
      fit: 2,
      continuity: 0,
      multiples: 1,
      booking: 0,
      rental: 0,
      availability: 0,
      quick_change: 0,
      checkout_overdue: 0,
      workroom_late: 0,
      workroom_overbooked: 0,
    },
  },
  lapsedDismissals: [],
  characters: [
    { id: "c1", name: "Wren" },
    { id: "c2", name: "Moss" },
  ],
  shootDays: [{ id: "d1", date: "2027-01-11" }],
};
const filters: SnagFilters = { kind: "", characterId: "", shootDayId: "", includeDismissed: false };

function renderList(canDismiss = true) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <SnagsList productionId="p1" data={data} filters={filters} onFiltersChange={() => {}} canDismiss={canDismiss} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("groupSnags", () => {
  it("groups by severity in the order blocking, warning, note", () => {
    expect(groupSnags(snags, "severity").map((g) => g.label)).toEqual(["blocking", "warning", "note"]);
  });

  it("groups by character by name, a snag under each character it concerns, blocking first inside", () => {
    const groups = groupSnags(snags, "character");

    expect(groups.map((g) => g.label)).toEqual(["Moss", "Wren"]);
    expect(groups[1].snags.map((s) => s.title)).toEqual(["Oilskin short", "Tight jacket"]);
  });

  it("puts snags without a shoot day last when grouping by day", () => {
    expect(groupSnags(snags, "shootDay").map((g) => g.label)).toEqual(["Shoot day Mon 11 Jan 2027", "Not tied to one day"]);
  });
});

describe("SnagsList", () => {
  it("shows each snag with its explanation and fix link, grouped under severity headings", () => {
    renderList();

    const blocking = screen.getByRole("region", { name: "blocking" });
    expect(within(blocking).getByText("Oilskin short")).toBeTruthy();
    expect(screen.getAllByRole("link", { name: "Fix: Garment J-1" })).toHaveLength(3);
    expect(screen.getByText(/tight · by 28.1/)).toBeTruthy();
  });

  it("refuses a dismissal without a reason and sends nothing", async () => {
    const fetchMock = vi.fn();
    vi.stubGlobal("fetch", fetchMock);
    renderList();

    fireEvent.click(screen.getAllByRole("button", { name: "Dismiss…" })[0]);
    fireEvent.click(screen.getByRole("button", { name: "Dismiss snag", hidden: true }));

    expect(await screen.findByText("must be at least 3 characters")).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("hides dismiss for roles that may not dismiss", () => {
    renderList(false);

    expect(screen.queryByRole("button", { name: "Dismiss…" })).toBeNull();
  });
});
