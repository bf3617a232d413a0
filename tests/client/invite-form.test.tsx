import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { InviteForm } from "@/features/team/components/invite-form";

function renderForm() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <InviteForm productionId="p1" />
    </QueryClientProvider>,
  );
}

function jsonResponse(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { "Content-Type": "application/json" } });
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("InviteForm", () => {
  it("shows the schema's message, naming the field as the form does, and sends nothing", async () => {
    const fetchMock = vi.fn();
    vi.stubGlobal("fetch", fetchMock);
    renderForm();

    fireEvent.change(screen.getByLabelText("E-mail"), { target: { value: "not-an-address" } });
    fireEvent.click(screen.getByRole("button", { name: "Send invitation" }));

    expect(await screen.findByText("E-mail must be an e-mail address")).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("shows the server's field message (409 already a member) under the field", async () => {
    const fetchMock = vi.fn(async (url: string, _init?: RequestInit) => {
      if (url === "/api/auth/csrf") return jsonResponse(200, { token: "t" });
      return jsonResponse(409, {
        error: {
          code: "conflict",
          message: "E-mail is already a member of this production",
          fields: { email: "E-mail is already a member of this production" },
        },
      });
    });
    vi.stubGlobal("fetch", fetchMock);
    renderForm();

    fireEvent.change(screen.getByLabelText("E-mail"), { target: { value: "cutter@seamscene.test" } });
    fireEvent.change(screen.getByLabelText("Role"), { target: { value: "cutter" } });
    fireEvent.click(screen.getByRole("button", { name: "Send invitation" }));

    await waitFor(() => expect(screen.getByText("E-mail is already a member of this production")).toBeTruthy());
    const post = fetchMock.mock.calls.find(([u]) => u === "/api/productions/p1/invitations")!;
    expect(JSON.parse(post[1]!.body as string)).toEqual({ email: "cutter@seamscene.test", role: "cutter" });
    expect((post[1]!.headers as Record<string, string>)["X-CSRF-Token"]).toBe("t");
  });
});
