/**
 * The one table of what each production role may do. The server enforces it; the client uses it
 * to hide actions. Record-level rules (a vfx user sees only packets published to them) live in
 * server/policies and build on this table.
 */
export const roles = ["supervisor", "designer", "set_costumer", "cutter", "vfx"] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  supervisor: "Costume supervisor",
  designer: "Designer",
  set_costumer: "Set costumer",
  cutter: "Workroom (cutter / fitter)",
  vfx: "Digital-double artist",
};

const S: Role = "supervisor";
const D: Role = "designer";
const SC: Role = "set_costumer";
const C: Role = "cutter";
const V: Role = "vfx";

export const permissionTable = {
  "production.read": [S, D, SC, C, V],
  "production.update": [S],
  "member.read": [S],
  "member.invite": [S],
  "member.update": [S],
  "member.remove": [S],
  "outbox.read": [S],
  "audit.read": [S],
  "today.read": [S, D, SC, C],
  "breakdown.read": [S, D, SC, C],
  "breakdown.update": [S, D],
  "breakdown.import": [S, D],
  "cast.read": [S, D, SC, C],
  "cast.update": [S, D],
  "measurement.read": [S, D, C],
  "measurement.update": [S, D, C],
  "change.read": [S, D, SC, C],
  "change.update": [S, D],
  "change.approve": [S, D],
  "continuity.read": [S, D, SC, C],
  "continuity.log": [S, D, SC],
  "garment.read": [S, D, SC, C],
  "garment.update": [S, D],
  "garment.move": [S, D, SC, C],
  "fabric.read": [S, D, C],
  "fabric.update": [S, D, C],
  "photo.read": [S, D, SC, C],
  "snag.read": [S, D, SC, C],
  "snag.dismiss": [S, D],
  "fitting.read": [S, D, SC, C],
  "fitting.update": [S, D, C],
  /**
   * At a fitting, link a change item that has no garment yet to one from stock, or add the garment
   * there. The workroom may do this although it cannot edit changes: it is a wardrobe fact (which
   * piece the item is), not a design decision, and the fitting is where it is found out.
   */
  "fitting.link_garment": [S, D, C],
  "alteration.read": [S, D, SC, C],
  "alteration.update": [S, D, C],
  "alteration.estimate": [S, D, C],
  "workroom.capacity": [S, C],
  /** Workroom e-mails (invitations, reminders): see failed sends and send again. */
  "workroom.mail": [S],
  "panel.read": [S, D, C],
  "panel.update": [S, C],
  "packet.read": [S, C, V],
  /**
   * Every packet of the production: drafts, all versions and all recipients. Without it a reader sees only
   * the published versions sent to them, and only their own receipt.
   */
  "packet.read_all": [S, C],
  "packet.prepare": [S, C],
  "packet.publish": [S],
  "packet.receive": [V],
  /** Reports screen: opens it (each report below has its own action). */
  "report.read": [S, D, SC],
  /** Continuity book PDFs (one character, or every book in one ZIP). No measurements appear in them. */
  "report.continuity": [S, D, SC],
  /** Tomorrow's rack list (phone view and PDF for the rack). */
  "report.rack": [S, D, SC],
  /** Returns and wrap: rentals due back, lost items, garments out, what to return, keep or sell. */
  "report.returns": [S, D, SC],
  /** Budget: costs by category, character, change and source. */
  "report.budget": [S, D],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof permissionTable;
export const actions = Object.keys(permissionTable) as Action[];

/** Whether a role may perform an action. */
export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return (permissionTable[action] as readonly Role[]).includes(role);
}

/** The roles that may perform an action (e.g. who can be sent a packet). */
export function rolesThatCan(action: Action): Role[] {
  return [...permissionTable[action]];
}

/** Screens of the app and the action that opens each; the client builds its navigation from this. */
export const screens = [
  { key: "today", label: "Today", action: "today.read" },
  { key: "breakdown", label: "Breakdown", action: "breakdown.read" },
  { key: "cast", label: "Cast", action: "cast.read" },
  { key: "wardrobe", label: "Wardrobe", action: "garment.read" },
  { key: "changes", label: "Changes", action: "change.update" },
  { key: "continuity", label: "Continuity", action: "continuity.read" },
  { key: "workroom", label: "Workroom", action: "alteration.read" },
  { key: "snags", label: "Snags", action: "snag.read" },
  { key: "doubles", label: "Digital doubles", action: "packet.read" },
  { key: "fabrics", label: "Fabrics", action: "fabric.read" },
  { key: "reports", label: "Reports", action: "report.read" },
  { key: "team", label: "Team", action: "member.read" },
] as const satisfies ReadonlyArray<{ key: string; label: string; action: Action }>;
export type ScreenKey = (typeof screens)[number]["key"];
