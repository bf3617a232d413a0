import { describe, expect, it } from "vitest";
import { actions, can, permissionTable, roles, rolesThatCan, screens } from "../../shared/permissions.js";

// The role rules written in the design document's "People and roles" table.
describe("permission table", () => {
  it("gives the vfx role only its packets and the production header", () => {
    const vfx = actions.filter((a) => can("vfx", a)).sort();

    expect(vfx).toEqual(["packet.read", "packet.receive", "production.read"]);
  });

  it("shows every packet (drafts, all recipients) to supervisor and workroom; the vfx role only its own", () => {
    expect(roles.filter((r) => can(r, "packet.read_all"))).toEqual(["supervisor", "cutter"]);
    expect(rolesThatCan("packet.receive")).toEqual(["vfx"]);
  });

  it("lets only supervisor, designer and cutter read measurements (personal data)", () => {
    expect(roles.filter((r) => can(r, "measurement.read"))).toEqual(["supervisor", "designer", "cutter"]);
  });

  it("lets set costumers log continuity and move garments but not edit the breakdown", () => {
    expect(can("set_costumer", "continuity.log")).toBe(true);
    expect(can("set_costumer", "garment.move")).toBe(true);
    expect(can("set_costumer", "breakdown.update")).toBe(false);
    expect(can("set_costumer", "alteration.estimate")).toBe(false);
  });

  it("reserves members, roles and packet publishing to the supervisor", () => {
    for (const a of ["member.invite", "member.update", "member.remove", "packet.publish"] as const) {
      expect(roles.filter((r) => can(r, a))).toEqual(["supervisor"]);
    }
  });

  it("gives the supervisor every action except receiving packets, which is the artists'", () => {
    expect(actions.filter((a) => !can("supervisor", a))).toEqual(["packet.receive"]);
  });

  it("refuses unknown or missing roles", () => {
    expect(can(undefined, "production.read")).toBe(false);
    expect(can(null, "production.read")).toBe(false);
  });

  it("opens every screen through an action in the table", () => {
    for (const s of screens) expect(Object.keys(permissionTable)).toContain(s.action);
  });
});
