import { SafetyNote } from "@/components/ui/feedback";
import type { TaskKind } from "@shared/schemas/workroom";

const CAUTIONS: Partial<Record<TaskKind, string>> = {
  dye: "Dyes, mordants and colour removers: wear gloves, eye protection and a suitable mask for powders; work with extraction or good ventilation; keep dye pots away from food; read each product's safety data sheet and dispose of baths as it says.",
  distress:
    "Distressing uses blades, rasps, wire brushes, sanders, heat guns and sometimes solvents or paints: cut away from the body, wear cut-resistant gloves and a dust mask, ventilate when spraying or using solvents, and never distress a garment on the performer.",
  press:
    "Irons, steamers and heat guns burn: keep the cord clear, set the iron down on its heel or rest, and let steam clear before handling.",
};

/** The cautions for the hazardous tasks among `kinds` (dye, distress, pressing / heat), or nothing. */
export function TaskSafetyNotes({ kinds }: { kinds: readonly string[] }) {
  const present = (Object.keys(CAUTIONS) as TaskKind[]).filter((k) => kinds.includes(k));
  if (present.length === 0) return null;
  return (
    <div className="grid gap-2">
      {present.map((k) => (
        <SafetyNote key={k}>{CAUTIONS[k]}</SafetyNote>
      ))}
    </div>
  );
}
