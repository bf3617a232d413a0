// How each kind of queued record reaches the server: the same API the screens use, plus the
// record's client id.
import { api } from "@/lib/api-client";
import type { QueuedItem } from "./db";

function appendField(form: FormData, key: string, value: unknown): void {
  if (value === null || value === undefined || value === "") return;
  if (Array.isArray(value)) for (const v of value) form.append(key, String(v));
  else if (typeof value === "object") form.set(key, JSON.stringify(value));
  else form.set(key, String(value));
}

/** The multipart body of a queued continuity entry: its fields, then each photo with its view. */
export function continuityForm(item: QueuedItem): FormData {
  const form = new FormData();
  form.set("clientId", item.clientId);
  for (const [k, v] of Object.entries(item.payload)) appendField(form, k, v);
  for (const p of item.photos) {
    form.append("views", p.view);
    form.append("photos", new Blob([p.bytes], { type: p.type }), p.name);
  }
  return form;
}

/** Sends one queued record. */
export async function sendQueuedItem(item: QueuedItem): Promise<unknown> {
  const base = `/productions/${item.productionId}`;
  switch (item.kind) {
    case "continuity":
      return api.upload(`${base}/continuity`, continuityForm(item));
    case "garment-scan":
      return api.post(`${base}/garments/scan`, { ...item.payload, clientId: item.clientId });
  }
}
