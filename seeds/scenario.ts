/**
 * The invented demo scenario shared by every seed step, so records made by different steps link up.
 * "Saltmarsh Hollow": a 1920s coastal-village feature; 60 scenes over 12 story days, 18 shoot days
 * (working days, anchored to the day the demo is seeded: see seeds/calendar.ts), 10 characters,
 * 2 stunt doubles, one digital double. All names are invented.
 */
import { demoId } from "./ids.js";

/** Shoot day (1-based) on which the Reverend wears the rented frock coat after it is due back. */
export const FROCK_COAT_WORN_ON_SHOOT_DAY = 14;
/** Shoot day on whose date the frock coat is due back at the hire house. */
export const FROCK_COAT_DUE_SHOOT_DAY = 10;

/** Performers (real-person records in the app; invented here). */
export const performers = {
  maud: { id: demoId("performer:maud"), name: "Rosalind Ashgrove" },
  elias: { id: demoId("performer:elias"), name: "Corwen Blakely" },
  jory: { id: demoId("performer:jory"), name: "Kit Lanyon" },
  ambrose: { id: demoId("performer:ambrose"), name: "Percival Tonkin" },
  hester: { id: demoId("performer:hester"), name: "Morwenna Strick" },
  silas: { id: demoId("performer:silas"), name: "Garrick Vane" },
  tamsin: { id: demoId("performer:tamsin"), name: "Ellery Nance" },
  obadiah: { id: demoId("performer:obadiah"), name: "Lucan Pryor" },
  lowdy: { id: demoId("performer:lowdy"), name: "Bryony Carne" },
  pascoe: { id: demoId("performer:pascoe"), name: "Denzil Opie" },
  eliasStunt: { id: demoId("performer:elias-stunt"), name: "Rook Hambly" },
  silasStunt: { id: demoId("performer:silas-stunt"), name: "Talan Jewell" },
} as const;

/** Characters, each played by a performer; Elias and Silas have stunt doubles, Elias a digital double. */
export const characters = {
  maud: { id: demoId("character:maud"), name: "Maud Penhallow", performer: "maud" },
  elias: { id: demoId("character:elias"), name: "Elias Marr", performer: "elias", stuntDouble: "eliasStunt" },
  jory: { id: demoId("character:jory"), name: "Jory Penhallow", performer: "jory" },
  ambrose: { id: demoId("character:ambrose"), name: "Reverend Ambrose Kittow", performer: "ambrose" },
  hester: { id: demoId("character:hester"), name: "Hester Quiller", performer: "hester" },
  silas: { id: demoId("character:silas"), name: "Captain Silas Rowe", performer: "silas", stuntDouble: "silasStunt" },
  tamsin: { id: demoId("character:tamsin"), name: "Tamsin Rowe", performer: "tamsin" },
  obadiah: { id: demoId("character:obadiah"), name: "Dr Obadiah Fenn", performer: "obadiah" },
  lowdy: { id: demoId("character:lowdy"), name: "Lowdy Trevaskis", performer: "lowdy" },
  pascoe: { id: demoId("character:pascoe"), name: "Constable Pascoe Hendra", performer: "pascoe" },
} as const;

/**
 * Garments the breakdown's change items point at, and the conflicts the demo is built to contain.
 * The wardrobe seed creates these ids; the breakdown seed links change items to them.
 */
export const keyGarments = {
  /** Elias's keeper's jacket, fitted wool: finished chest too small for his performer → fit snag. */
  eliasJacket: demoId("garment:elias-keeper-jacket"),
  eliasShirt: demoId("garment:elias-shirt"),
  eliasTrousers: demoId("garment:elias-trousers"),
  eliasBoots: demoId("garment:elias-boots"),
  /** Silas's storm oilskin: multiples group of 2 copies, but the shoot order needs 3 → multiples snag. */
  silasOilskinGroup: demoId("group:silas-oilskin"),
  /** Reverend's frock coat, rented, due back on shoot day 10's date but worn on shoot day 14 → rental snag. */
  ambroseFrockCoat: demoId("garment:ambrose-frock-coat"),
  maudDressDay: demoId("garment:maud-day-dress"),
  maudShawl: demoId("garment:maud-shawl"),
  maudMourning: demoId("garment:maud-mourning-dress"),
} as const;

/** Planned conflicts (for the snag demo; the steps that seed them keep these true). */
export const plannedConflicts = [
  "fit: Elias Marr's keeper's jacket is tight at the chest on Corwen Blakely",
  "continuity: Maud Penhallow changes between scenes 18 and 19 (story day 4) with no change marked",
  "multiples: Silas Rowe's storm oilskin needs 3 copies in shoot order (distress 2, 1, 0 on one day run) but the group holds 2",
  "rental: the Reverend's frock coat is due back on shoot day 10's date but is worn on shoot day 14",
  "quick change (stage): The Glass Orchard's Nell has under 2 minutes between acts in different changes",
] as const;

/**
 * Every other garment key the breakdown's change items point at (besides keyGarments). The wardrobe
 * step creates garments with ids `demoId("garment:<key>")`; the breakdown-links step links items to
 * those that exist.
 */
export const changeItemGarments = [
  "maud-apron",
  "maud-oilcloth-coat",
  "maud-blue-dress",
  "maud-sunday-hat",
  "maud-veil",
  "elias-storm-smock",
  "elias-sea-boots",
  "elias-sunday-suit",
  "elias-white-shirt",
  "jory-guernsey",
  "jory-smock",
  "jory-guernsey-torn",
  "ambrose-collar",
  "ambrose-bands",
  "hester-shop-coat",
  "hester-print-dress",
  "hester-travelling-coat",
  "hester-cloche",
  "silas-reefer-jacket",
  "silas-peaked-cap",
  "silas-souwester",
  "silas-sea-boots",
  "silas-mourning-band",
  "tamsin-pinafore",
  "tamsin-boots",
  "tamsin-borrowed-coat",
  "obadiah-tweed-suit",
  "lowdy-blouse",
  "lowdy-skirt",
  "lowdy-best-blouse",
  "lowdy-cardigan",
  "pascoe-tunic",
  "pascoe-helmet",
] as const;
