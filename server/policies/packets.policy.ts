import { can } from "@shared/permissions.js";
import type { Actor } from "../middleware/require-auth.js";

/**
 * Whether the actor may see a packet: every packet with packet.read_all; otherwise (vfx users) only
 * published versions they are a recipient of (everything else answers 404, so packet ids cannot be probed).
 */
export function canSeePacket(actor: Actor, packet: { status: "draft" | "published" }, recipientUserIds: readonly string[]): boolean {
  if (can(actor.role, "packet.read_all")) return true;
  return can(actor.role, "packet.read") && packet.status === "published" && recipientUserIds.includes(actor.user.id);
}

/** Whether the actor may mark this packet received: only a vfx recipient of a published version. */
export function canReceivePacket(actor: Actor, packet: { status: "draft" | "published" }, recipientUserIds: readonly string[]): boolean {
  return can(actor.role, "packet.receive") && packet.status === "published" && recipientUserIds.includes(actor.user.id);
}
