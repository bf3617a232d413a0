/**
 * Step "breakdown links" (Breakdown feature), after the wardrobe step: change items pointing at
 * garments and multiples groups, and continuity entries with generated photos for shoot days 1–3.
 * Items whose garment does not exist (yet) keep their label with no link.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../server/db.js";
import { ChangeItem, ContinuityEntry, ContinuityEntryGarment, Photo } from "../server/models/index.js";
import { renderSwatch } from "../server/lib/images.js";
import { releaseStoredImages, storeImage } from "../server/services/photos.service.js";
import { demoId } from "./ids.js";
import { SALTMARSH_ID, userId } from "./accounts.js";
import { characters, keyGarments } from "./scenario.js";
import { shootDay } from "./calendar.js";
import { castOf, changeFor, demoSchedule, stateFor } from "./breakdown.js";

type CharKey = keyof typeof characters;
type Target = { garment?: string; key?: keyof typeof keyGarments; group?: keyof typeof keyGarments };

/** Items of each change: label and what it points at (garment key, key garment, or multiples group). */
export const changeItems: Record<string, Array<[string, Target]>> = {
  "elias:1": [
    ["Keeper's jacket", { key: "eliasJacket" }],
    ["Flannel shirt", { key: "eliasShirt" }],
    ["Moleskin trousers", { key: "eliasTrousers" }],
    ["Boots", { key: "eliasBoots" }],
  ],
  "elias:2": [
    ["Oilskin smock", { garment: "elias-storm-smock" }],
    ["Flannel shirt", { key: "eliasShirt" }],
    ["Moleskin trousers", { key: "eliasTrousers" }],
    ["Sea boots", { garment: "elias-sea-boots" }],
  ],
  "elias:3": [
    ["Sunday suit", { garment: "elias-sunday-suit" }],
    ["White shirt", { garment: "elias-white-shirt" }],
  ],
  "maud:1": [
    ["Day dress", { key: "maudDressDay" }],
    ["Knitted shawl", { key: "maudShawl" }],
    ["Apron", { garment: "maud-apron" }],
  ],
  "maud:2": [
    ["Day dress", { key: "maudDressDay" }],
    ["Oilcloth coat", { garment: "maud-oilcloth-coat" }],
  ],
  "maud:3": [
    ["Blue wool dress", { garment: "maud-blue-dress" }],
    ["Sunday hat", { garment: "maud-sunday-hat" }],
  ],
  "maud:4": [
    ["Mourning dress", { key: "maudMourning" }],
    ["Veil", { garment: "maud-veil" }],
  ],
  "jory:1": [
    ["Guernsey", { garment: "jory-guernsey" }],
    ["Canvas smock", { garment: "jory-smock" }],
  ],
  "jory:2": [["Guernsey, torn", { garment: "jory-guernsey-torn" }]],
  "ambrose:1": [
    ["Frock coat (rented)", { key: "ambroseFrockCoat" }],
    ["Clerical collar", { garment: "ambrose-collar" }],
    ["Bands", { garment: "ambrose-bands" }],
  ],
  "hester:1": [
    ["Shop coat", { garment: "hester-shop-coat" }],
    ["Print dress", { garment: "hester-print-dress" }],
  ],
  "hester:2": [
    ["Travelling coat", { garment: "hester-travelling-coat" }],
    ["Cloche", { garment: "hester-cloche" }],
  ],
  "silas:1": [
    ["Reefer jacket", { garment: "silas-reefer-jacket" }],
    ["Peaked cap", { garment: "silas-peaked-cap" }],
  ],
  "silas:2": [
    ["Storm oilskin", { group: "silasOilskinGroup" }],
    ["Sou'wester", { garment: "silas-souwester" }],
    ["Sea boots", { garment: "silas-sea-boots" }],
  ],
  "silas:3": [
    ["Reefer jacket", { garment: "silas-reefer-jacket" }],
    ["Mourning band", { garment: "silas-mourning-band" }],
  ],
  "tamsin:1": [
    ["Pinafore", { garment: "tamsin-pinafore" }],
    ["Boots", { garment: "tamsin-boots" }],
  ],
  "tamsin:2": [["Borrowed coat", { garment: "tamsin-borrowed-coat" }]],
  "obadiah:1": [["Tweed three-piece", { garment: "obadiah-tweed-suit" }]],
  "lowdy:1": [
    ["Blouse", { garment: "lowdy-blouse" }],
    ["Skirt", { garment: "lowdy-skirt" }],
  ],
  "lowdy:2": [
    ["Best blouse", { garment: "lowdy-best-blouse" }],
    ["Cardigan", { garment: "lowdy-cardigan" }],
  ],
  "pascoe:1": [
    ["Constable's tunic", { garment: "pascoe-tunic" }],
    ["Helmet", { garment: "pascoe-helmet" }],
  ],
};

async function existing(table: "garments" | "multiples_groups", ids: string[], t: Transaction): Promise<Set<string>> {
  if (!ids.length) return new Set();
  const rows = await sequelize.query<{ id: string }>(`SELECT id FROM ${table} WHERE id IN (:ids)`, {
    replacements: { ids },
    type: QueryTypes.SELECT,
    transaction: t,
  });
  return new Set(rows.map((r) => r.id));
}

const COLOURS: Record<CharKey, string> = {
  maud: "#5B6770",
  elias: "#2B3A67",
  jory: "#6B4E3D",
  ambrose: "#1F2430",
  hester: "#7A5C8E",
  silas: "#3E5C4A",
  tamsin: "#8E6A2B",
  obadiah: "#5E4B3C",
  lowdy: "#B5452E",
  pascoe: "#26334D",
};

/** Change items, then continuity entries with generated swatch photos for shoot days 1–3. */
export async function seedBreakdownLinks(t: Transaction): Promise<void> {
  const garmentId = (tg: Target) => (tg.key ? keyGarments[tg.key] : tg.garment ? demoId(`garment:${tg.garment}`) : null);
  const all = Object.values(changeItems).flat();
  const garments = await existing(
    "garments",
    all.map(([, tg]) => garmentId(tg)).filter((x): x is string => Boolean(x)),
    t,
  );
  const groups = await existing(
    "multiples_groups",
    all.map(([, tg]) => (tg.group ? keyGarments[tg.group] : null)).filter((x): x is string => Boolean(x)),
    t,
  );
  for (const [changeKey, items] of Object.entries(changeItems)) {
    const [ch, num] = changeKey.split(":");
    const changeId = demoId(`change:${ch}:${num}`);
    for (const [i, [label, tg]] of items.entries()) {
      const g = garmentId(tg);
      const grp = tg.group ? keyGarments[tg.group] : null;
      await ChangeItem.upsert(
        {
          id: demoId(`changeitem:${changeKey}:${i + 1}`),
          productionId: SALTMARSH_ID,
          changeId,
          label,
          garmentId: g && garments.has(g) ? g : null,
          multiplesGroupId: grp && groups.has(grp) ? grp : null,
          sortOrder: i + 1,
        },
        { transaction: t },
      );
    }
  }

  const schedule = demoSchedule();
  for (let d = 0; d < 3; d++) {
    const shootDayId = demoId(`shootday:saltmarsh:${d + 1}`);
    for (const n of schedule[d]!) {
      for (const k of castOf(n).slice(0, 2)) {
        const entryId = demoId(`continuity:saltmarsh:${d + 1}:${n}:${k}`);
        const change = changeFor(k, n);
        const state = stateFor(k, n);
        await ContinuityEntry.upsert(
          {
            id: entryId,
            productionId: SALTMARSH_ID,
            shootDayId,
            sceneId: demoId(`scene:saltmarsh:${n}`),
            characterId: characters[k].id,
            distressStage: state.distressStage,
            notes: noteFor(k, n),
            loggedBy: userId("set_costumer"),
          },
          { transaction: t },
        );
        const worn = (changeItems[`${k}:${change}`] ?? [])
          .map(([, tg]) => garmentId(tg))
          .filter((g): g is string => Boolean(g && garments.has(g)));
        for (const g of worn)
          await ContinuityEntryGarment.upsert(
            { id: demoId(`ceg:${entryId}:${g}`), productionId: SALTMARSH_ID, continuityEntryId: entryId, garmentId: g },
            { transaction: t },
          );
        for (const view of ["front", "back"] as const) {
          const img = await renderSwatch({
            width: 600,
            height: 800,
            background: COLOURS[k],
            label: `${characters[k].name.split(" ").slice(-2).join(" ")} · ch ${change}`,
            sublabel: `Sc ${n} · ${shootDay(d + 1)} · ${view}`,
          });
          const stored = await storeImage(img);
          await Photo.upsert(
            {
              id: demoId(`photo:${entryId}:${view}`),
              productionId: SALTMARSH_ID,
              ownerType: "continuity_entry",
              ownerId: entryId,
              view,
              caption: `${view} view (generated demo image)`,
              contentHash: stored.contentHash,
              originalName: `${n}-${k}-${view}.jpg`,
              width: stored.width,
              height: stored.height,
              bytes: stored.bytes,
              variants: stored.variants,
              uploadedBy: userId("set_costumer"),
            },
            { transaction: t },
          );
          await releaseStoredImages([stored]);
        }
      }
    }
  }
}

function noteFor(k: CharKey, n: number): string {
  const notes = [
    "Collar open, left cuff rolled twice.",
    "Shawl pinned at the left shoulder; apron strings tied at the back.",
    "Cap pushed back; jacket fully buttoned.",
    "Top button undone, sleeves down.",
    "Hem damp from the slip; boots unlaced on the left.",
  ];
  return `${notes[(n + k.length) % notes.length]}`;
}
