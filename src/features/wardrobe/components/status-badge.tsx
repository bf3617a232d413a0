import { Badge } from "@/components/ui/feedback";
import { garmentStatusLabels, type GarmentStatus } from "@shared/schemas/garments";

const tones: Record<GarmentStatus, "blocking" | "warning" | "note" | "neutral"> = {
  in_stock: "neutral",
  fitting: "warning",
  workroom: "warning",
  on_set: "note",
  cleaning: "note",
  returned: "note",
  lost: "blocking",
};

/** A garment's status as a small label. */
export function StatusBadge({ status }: { status: GarmentStatus }) {
  return <Badge tone={tones[status]}>{garmentStatusLabels[status]}</Badge>;
}
