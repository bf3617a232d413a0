// Every action that destroys work or tells someone outside the app asks first or offers an undo
// (the list is beside ConfirmDialog in src/components/ui/dialog). Each test: the action's button
// sends nothing; Cancel in the dialog sends nothing; confirming sends exactly the one request.
import type { ReactNode } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import { InvitationsList } from "@/features/team/components/invitations-list";
import { MembersTable } from "@/features/team/components/members-table";
import { EmailFailures } from "@/features/workroom/components/email-failures";
import { FittingView } from "@/features/workroom/components/fitting-view";
import { OwnerPhotos } from "@/components/photos";
import { ScenePage } from "@/features/breakdown/components/scene-page";
import { SceneForm } from "@/features/breakdown/components/scene-form";
import { ShootDayEditor } from "@/features/breakdown/components/shoot-day-editor";
import { SeamsTab } from "@/features/doubles/components/seams-tab";
import { MeasurementHistory } from "@/features/measurements/components/measurement-history";
import type { SceneDetailDto, SceneRowDto, ShootDayDto } from "@shared/schemas/breakdown";
import type { FittingDetailDto, WorkroomOptionsDto } from "@shared/schemas/workroom";
import type { DoublesChangeDto } from "@shared/schemas/doubles";

type Call = { method: string; url: string; body: unknown };

/** A fetch stand-in: GETs answer from `gets` (by path prefix), writes are recorded and answer `{}`. */
function stubApi(gets: Record<string, unknown> = {}) {
  const calls: Call[] = [];
  vi.stubGlobal(
    "fetch",
    vi.fn(async (input: string, init?: RequestInit) => {
      const url = String(input);
      const method = (init?.method ?? "GET").toUpperCase();
      const json = (data: unknown, status = 200) =>
        new Response(status === 204 ? null : JSON.stringify(data), { status, headers: { "Content-Type": "application/json" } });
      if (url.endsWith("/api/auth/csrf")) return json({ token: "t" });
      if (method === "GET") {
        const key = Object.keys(gets).find((k) => url.replace(/^\/api/, "").startsWith(k));
        return json({ data: key ? gets[key] : [] });
      }
      calls.push({ method, url, body: init?.body ? JSON.parse(String(init.body)) : null });
      return method === "DELETE" ? json(null, 204) : json({ data: {} });
    }),
  );
  return { writes: () => calls };
}

function wrap(ui: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>{ui}</MemoryRouter>
    </QueryClientProvider>,
  );
}

/** Opens with `trigger`, checks nothing was sent, cancels, opens again, confirms; returns the writes. */
async function confirmFlow(api: ReturnType<typeof stubApi>, trigger: () => void, confirmLabel: string | RegExp) {
  trigger();
  await screen.findAllByRole("button", { name: confirmLabel, hidden: true });
  expect(api.writes()).toEqual([]);
  fireEvent.click(screen.getAllByRole("button", { name: "Cancel", hidden: true }).at(-1)!);
  expect(api.writes()).toEqual([]);
  trigger();
  await screen.findAllByRole("button", { name: confirmLabel, hidden: true });
  // The dialog comes after its trigger in the page, so its button is the last of that name.
  fireEvent.click(screen.getAllByRole("button", { name: confirmLabel, hidden: true }).at(-1)!);
  await waitFor(() => expect(api.writes().length).toBeGreaterThan(0));
  return api.writes();
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const scene: SceneDetailDto = {
  id: "s1",
  number: "12",
  setName: "Harbour wall",
  intExt: "EXT",
  timeOfDay: "DAY",
  storyDay: 3,
  storyOrder: 12,
  lengthEighths: 11,
  runningMinutes: null,
  synopsis: "Nets",
  shootDays: [{ id: "d1", dayNumber: 1, date: "2030-09-02", kind: "shoot" }],
  appearances: [
    {
      id: "a1",
      sceneId: "s1",
      characterId: "c1",
      changeId: null,
      distressStage: 0,
      wet: false,
      stunt: false,
      blood: false,
      vfxShot: false,
      changeHere: false,
      notes: null,
      characterName: "Wren",
      change: null,
      minutesSincePreviousExit: null,
    },
  ],
};

describe("asks before destroying work or e-mailing", () => {
  it("Team: withdrawing an invitation", async () => {
    const api = stubApi();
    wrap(
      <InvitationsList
        productionId="p1"
        invitations={[
          { id: "i1", email: "new@example.test", role: "designer", expiresAt: "2030-09-09", createdAt: "2030-09-02", status: "pending" },
        ]}
      />,
    );

    const writes = await confirmFlow(api, () => fireEvent.click(screen.getByRole("button", { name: "Withdraw" })), "Withdraw invitation");

    expect(writes).toEqual([{ method: "DELETE", url: "/api/productions/p1/invitations/i1", body: null }]);
  });

  it("Team: removing a member", async () => {
    const api = stubApi();
    wrap(
      <MembersTable
        productionId="p1"
        currentUserId="u0"
        members={
          [
            { id: "m1", userId: "u1", name: "Tobias", email: "t@example.test", role: "set_costumer", joinedAt: "2030-09-02T00:00:00Z" },
          ] as never
        }
      />,
    );

    const writes = await confirmFlow(api, () => fireEvent.click(screen.getByRole("button", { name: "Remove" })), "Remove from production");

    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/members/m1"]);
  });

  it("Workroom: sending a failed e-mail again", async () => {
    const api = stubApi();
    wrap(
      <EmailFailures
        productionId="p1"
        jobs={[
          {
            id: "j1",
            kind: "fitting_invite",
            recipient: "performer@example.test",
            subject: "Fitting",
            status: "failed",
            attempts: 3,
            lastError: "timeout",
            sentAt: null,
            createdAt: "2030-09-02T10:00:00Z",
          },
        ]}
      />,
    );

    fireEvent.click(screen.getByRole("button", { name: "Send again" }));
    expect(screen.getByText(/goes to performer@example.test/)).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Cancel", hidden: true }));
    const writes = await confirmFlow(api, () => fireEvent.click(screen.getAllByRole("button", { name: "Send again" })[0]!), /^Send again$/);

    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["POST /api/productions/p1/workroom/email-jobs/j1/retry"]);
  });

  it("Photos: deleting a photo", async () => {
    const api = stubApi({
      "/productions/p1/photos": [
        {
          id: "ph1",
          view: "front",
          caption: null,
          width: 10,
          height: 10,
          takenAt: null,
          createdAt: "2030-09-02T10:00:00Z",
          urls: { thumb: "", medium: "", large: "" },
        },
      ],
    });
    wrap(<OwnerPhotos productionId="p1" ownerType="scene" ownerId="s1" canEdit />);

    const button = await screen.findByRole("button", { name: "Delete front photo" });
    const writes = await confirmFlow(api, () => fireEvent.click(button), "Delete photo");

    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/photos/ph1"]);
  });

  it("Breakdown: taking a character out of a scene", async () => {
    const api = stubApi();
    wrap(<ScenePage productionId="p1" scene={scene} characters={[]} changes={[]} canEdit stage={false} characterHref={() => "#"} />);

    const writes = await confirmFlow(api, () => fireEvent.click(screen.getByRole("button", { name: "Remove" })), "Take out of scene");

    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/appearances/a1"]);
  });

  it("Breakdown: deleting a scene names what goes with it", async () => {
    const api = stubApi();
    const onDeleted = vi.fn();
    wrap(<SceneForm productionId="p1" scene={scene} stage={false} onDeleted={onDeleted} />);

    const writes = await confirmFlow(api, () => fireEvent.click(screen.getByRole("button", { name: "Delete scene" })), "Delete scene");

    expect(screen.getByText(/every continuity entry and photo logged for it/)).toBeTruthy();
    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/scenes/s1"]);
    await waitFor(() => expect(onDeleted).toHaveBeenCalled());
  });

  it("Cast: deleting a measurement set (the page's dialog is opened by this button)", () => {
    const onDelete = vi.fn();
    wrap(
      <MeasurementHistory
        sets={[{ id: "m1", takenOn: "2030-09-01", valuesMm: { chest_girth: 980 }, notes: null, takenByName: null } as never]}
        unit="cm"
        onDelete={onDelete}
      />,
    );

    fireEvent.click(screen.getByRole("button", { name: "Delete the set of Sun 1 Sep 2030" }));

    // The history only asks the page to confirm; it deletes nothing itself.
    expect(onDelete).toHaveBeenCalledWith("m1");
  });

  it("Digital doubles: deleting a seam", async () => {
    const seam = {
      id: "se1",
      name: "Side seam",
      a: { panelId: "pa", panelName: "Front", from: 0, to: 1, direction: "forward" },
      b: { panelId: "pb", panelName: "Back", from: 0, to: 1, direction: "forward" },
      toleranceMm: null,
      effectiveToleranceMm: 3,
      eased: null,
      lengthA: 500,
      lengthB: 500,
      differenceMm: 0,
      status: "ok",
      message: "",
    };
    const api = stubApi({ "/productions/p1/seams": [seam], "/productions/p1/panels": [] });
    wrap(<SeamsTab productionId="p1" change={{ id: "ch1", garments: [] } as unknown as DoublesChangeDto} canEdit />);

    const button = await screen.findByRole("button", { name: "Delete seam Side seam" });
    const writes = await confirmFlow(api, () => fireEvent.click(button), "Delete seam");

    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/seams/se1"]);
  });
});

describe("the fitting: cancelling e-mails the performer, so it asks first", () => {
  const fitting: FittingDetailDto = {
    id: "f1",
    performerId: "pf1",
    performerName: "Corwen Blakely",
    performerEmail: "corwen@example.test",
    changeId: "ch1",
    changeLabel: "Elias Marr · change 2",
    startsAt: "2030-09-03T09:30:00Z",
    endsAt: "2030-09-03T10:00:00Z",
    durationMinutes: 30,
    room: null,
    attendeeIds: [],
    attendeeNames: [],
    notes: null,
    outcome: null,
    status: "booked",
    ticketCount: 0,
    items: [
      {
        changeItemId: "ci1",
        label: "Knitted muffler",
        garmentId: null,
        tagCode: null,
        garmentName: null,
        garmentStatus: null,
        fit: [],
        openTicketIds: [],
      },
    ],
    measurements: null,
    fitSnags: [],
    tickets: [],
  } as unknown as FittingDetailDto;
  const options = { performers: [], changes: [], members: [] } as unknown as WorkroomOptionsDto;

  it("Cancel fitting… asks, names the address, and only then sends the cancellation", async () => {
    const api = stubApi();
    wrap(<FittingView productionId="p1" fitting={fitting} options={options} units="cm" canEdit canLink />);

    const writes = await confirmFlow(
      api,
      () => fireEvent.click(screen.getByRole("button", { name: "Cancel fitting…" })),
      "Cancel fitting and e-mail",
    );

    expect(screen.getByText(/e-mailed a cancellation at corwen@example.test/)).toBeTruthy();
    expect(writes).toEqual([{ method: "PATCH", url: "/api/productions/p1/fittings/f1", body: { status: "cancelled" } }]);
  });

  it("an item without a garment offers Link a garment to roles that may link, not to others", () => {
    stubApi();
    wrap(<FittingView productionId="p1" fitting={fitting} options={options} units="cm" canEdit canLink={false} />);

    expect(screen.queryByRole("button", { name: "Link a garment to Knitted muffler" })).toBeNull();
    expect(screen.getByText(/no garment linked yet/)).toBeTruthy();
  });
});

describe("the shoot-day editor", () => {
  const scenes = [
    {
      id: "s1",
      number: "1",
      setName: "Quay",
      intExt: "EXT",
      timeOfDay: "DAY",
      storyDay: 1,
      storyOrder: 1,
      lengthEighths: 8,
      runningMinutes: null,
      synopsis: null,
      shootDays: [{ id: "d1", dayNumber: 1, date: "2030-09-02" }],
      characters: [],
    },
    {
      id: "s2",
      number: "2",
      setName: "Chapel",
      intExt: "INT",
      timeOfDay: "NIGHT",
      storyDay: 1,
      storyOrder: 2,
      lengthEighths: 4,
      runningMinutes: null,
      synopsis: null,
      shootDays: [{ id: "d1", dayNumber: 1, date: "2030-09-02" }],
      characters: [],
    },
  ] as SceneRowDto[];
  const days: ShootDayDto[] = [
    {
      id: "d1",
      dayNumber: 1,
      date: "2030-09-02",
      kind: "shoot",
      startsAt: "07:00",
      notes: null,
      scenes: [
        { id: "s1", number: "1", position: 1, setName: "Quay", storyDay: 1 },
        { id: "s2", number: "2", position: 2, setName: "Chapel", storyDay: 1 },
      ],
    },
  ];
  const editor = () =>
    wrap(
      <ShootDayEditor
        productionId="p1"
        days={days}
        scenes={scenes}
        stage={false}
        canEdit
        today="2030-09-01"
        sceneHref={(id) => `/s/${id}`}
      />,
    );

  it("deleting a day asks first and says what happens to its scenes", async () => {
    const api = stubApi();
    editor();

    const writes = await confirmFlow(api, () => fireEvent.click(screen.getByRole("button", { name: "Delete shoot day" })), "Delete day 1");

    expect(screen.getByText(/Its 2 scenes stay in the breakdown/)).toBeTruthy();
    expect(writes.map((w) => `${w.method} ${w.url}`)).toEqual(["DELETE /api/productions/p1/shoot-days/d1"]);
  });

  it("taking a scene off a day offers Undo, which puts the order back", async () => {
    const api = stubApi();
    editor();

    fireEvent.click(screen.getByRole("button", { name: "Take off scene 1" }));
    const undo = await screen.findByRole("button", { name: "Undo" });
    expect(
      screen
        .getAllByRole("status")
        .map((x) => x.textContent)
        .join(" "),
    ).toContain("Scene 1 taken off Day 1.");
    fireEvent.click(undo);

    await waitFor(() => expect(api.writes()).toHaveLength(2));
    expect(api.writes().map((w) => w.body)).toEqual([{ sceneIds: ["s2"] }, { sceneIds: ["s1", "s2"] }]);
  });

  it("a new day without a date is refused on the spot, nothing sent", () => {
    const api = stubApi();
    editor();

    fireEvent.click(screen.getByRole("button", { name: "Add shoot day" }));

    expect(screen.getByText("Choose the date.")).toBeTruthy();
    expect(api.writes()).toEqual([]);
  });
});
