import type { SceneDetailDto, ShootDayDto } from "./breakdown.js";
import type { CharacterDto } from "./cast.js";
import type { ChangeDto } from "./changes.js";
import type { ContinuityEntryDto } from "./continuity.js";
import type { GarmentDto } from "./garments.js";
import type { ProductionDto } from "./productions.js";

/** How many shoot days (or performances) from today a phone keeps for working without a signal. */
export const OFFLINE_DAYS = 2;
/** Latest continuity entries with photos kept per character, as reference for the next scenes. */
export const OFFLINE_ENTRIES_PER_CHARACTER = 4;

/**
 * What a set costumer's phone keeps for working without a signal: the next shoot days with their
 * scenes, the characters and changes in them, the garments those changes name (every copy of a
 * multiples group) and the characters' latest continuity entries (their thumbnails are saved too).
 */
export interface OfflinePackDto {
  /** When the server put it together (its clock): the "saved for offline at" stamp. */
  savedAt: string;
  production: ProductionDto;
  /** The next shoot days (or performances) from the production's today, in date order. */
  shootDays: ShootDayDto[];
  /** Each scene of those days: its characters, changes and required state. */
  scenes: SceneDetailDto[];
  characters: CharacterDto[];
  changes: ChangeDto[];
  garments: GarmentDto[];
  /** Each character's latest continuity entries with photos. */
  continuity: ContinuityEntryDto[];
}
