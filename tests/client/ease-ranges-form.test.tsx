import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { EaseRangesForm } from "@/features/productions/components/ease-ranges-form";
import type { ProductionDto } from "@shared/schemas/productions";

const production: ProductionDto = {
  id: "p1",
  title: "Test",
  kind: "film",
  startsOn: null,
  endsOn: null,
  units: "cm",
  settings: {},
  role: "supervisor",
  timeZone: "Europe/London",
  today: "2030-09-02",
};

function json(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { "Content-Type": "application/json" } });
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("EaseRangesForm", () => {
  it("takes a range in the production's unit and saves it in millimetres", async () => {
    const fetchMock = vi.fn(async (url: string, _init?: RequestInit) =>
      url === "/api/auth/csrf" ? json(200, { token: "t" }) : json(200, { data: production }),
    );
    vi.stubGlobal("fetch", fetchMock);
    render(
      <QueryClientProvider client={new QueryClient()}>
        <EaseRangesForm production={production} />
      </QueryClientProvider>,
    );

    fireEvent.change(screen.getByLabelText("Garment"), { target: { value: "jacket" } });
    fireEvent.change(screen.getByLabelText("Point"), { target: { value: "chest" } });
    fireEvent.change(screen.getByLabelText("Min ease (cm)"), { target: { value: "1" } });
    fireEvent.change(screen.getByLabelText("Max ease (cm)"), { target: { value: "3.5" } });
    fireEvent.click(screen.getByRole("button", { name: "Add or replace range" }));
    fireEvent.click(screen.getByRole("button", { name: "Save ease ranges" }));

    await waitFor(() => expect(fetchMock.mock.calls.some(([u]) => u === "/api/productions/p1")).toBe(true));
    const call = fetchMock.mock.calls.find(([u]) => u === "/api/productions/p1")!;
    // 1 cm = 10 mm and 3.5 cm = 35 mm exactly (SI prefixes).
    expect(JSON.parse(call[1]!.body as string)).toEqual({
      settings: { easeOverrides: { jacket: { chest: { fitted: { min: 10, max: 35 } } } } },
    });
  });

  it("refuses a maximum below the minimum and keeps the list unchanged", () => {
    vi.stubGlobal("fetch", vi.fn());
    render(
      <QueryClientProvider client={new QueryClient()}>
        <EaseRangesForm production={production} />
      </QueryClientProvider>,
    );

    fireEvent.change(screen.getByLabelText("Min ease (cm)"), { target: { value: "4" } });
    fireEvent.change(screen.getByLabelText("Max ease (cm)"), { target: { value: "2" } });
    fireEvent.click(screen.getByRole("button", { name: "Add or replace range" }));

    expect(screen.getByText("must be at least the minimum")).toBeTruthy();
    expect(screen.getByText("No own ranges: the handbook values apply everywhere.")).toBeTruthy();
  });
});
