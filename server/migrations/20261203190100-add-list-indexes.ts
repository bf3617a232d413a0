import type { Migration } from "../migrator.js";

/**
 * Indexes for every filter and sort the screens use, and for the production-scoped reads (the snag
 * snapshot, exports) of a database holding many productions. Checked by tests/server/list-plans.test.ts
 * with EXPLAIN on a 10× production.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    -- Wardrobe list: each sort key after the production (tag code has its unique index), and the filters.
    CREATE INDEX garments_name_idx ON garments (production_id, name, tag_code);
    CREATE INDEX garments_category_idx ON garments (production_id, category, tag_code);
    CREATE INDEX garments_rental_sort_idx ON garments (production_id, rental_due_on, tag_code);
    CREATE INDEX garments_rack_idx ON garments (production_id, location_rack, tag_code);
    CREATE INDEX garments_updated_idx ON garments (production_id, updated_at, tag_code);
    CREATE INDEX garments_status_sort_idx ON garments (production_id, status, tag_code);
    DROP INDEX garments_production_idx;
    -- The search box: "contains" in name, tag code, colour or vendor (trigram index; pg_trgm is a trusted
    -- extension, so the database owner may create it, and managed PostgreSQL services offer it).
    CREATE EXTENSION IF NOT EXISTS pg_trgm;
    CREATE INDEX garments_search_idx ON garments USING gin (name gin_trgm_ops, tag_code gin_trgm_ops, colour gin_trgm_ops, vendor gin_trgm_ops);
    CREATE INDEX garments_fabric_idx ON garments (fabric_id);
    CREATE INDEX change_items_garment_idx ON change_items (garment_id);
    CREATE INDEX change_items_group_idx ON change_items (multiples_group_id);
    CREATE INDEX change_items_production_idx ON change_items (production_id);
    -- Breakdown: story order then number, as the table sorts.
    CREATE INDEX scenes_list_idx ON scenes (production_id, story_order, number);
    DROP INDEX scenes_story_idx;
    CREATE INDEX scenes_story_day_idx ON scenes (production_id, story_day);
    CREATE INDEX shoot_day_scenes_production_idx ON shoot_day_scenes (production_id);
    CREATE INDEX appearances_production_idx ON appearances (production_id);
    CREATE INDEX changes_production_idx ON changes (production_id);
    CREATE INDEX character_doubles_production_idx ON character_doubles (production_id);
    CREATE INDEX multiples_groups_production_idx ON multiples_groups (production_id);
    CREATE INDEX measurement_sets_production_idx ON measurement_sets (production_id);
    CREATE INDEX continuity_entries_production_idx ON continuity_entries (production_id);
    CREATE INDEX continuity_entries_scene_idx ON continuity_entries (scene_id);
    CREATE INDEX continuity_entries_shoot_day_idx ON continuity_entries (shoot_day_id);
    CREATE INDEX continuity_entry_garments_production_idx ON continuity_entry_garments (production_id);
    CREATE INDEX continuity_entry_garments_garment_idx ON continuity_entry_garments (garment_id);
    CREATE INDEX garment_status_events_production_idx ON garment_status_events (production_id, created_at);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX garment_status_events_production_idx, continuity_entry_garments_garment_idx, continuity_entry_garments_production_idx,
      continuity_entries_shoot_day_idx, continuity_entries_scene_idx, continuity_entries_production_idx, measurement_sets_production_idx,
      multiples_groups_production_idx, character_doubles_production_idx, changes_production_idx, appearances_production_idx,
      shoot_day_scenes_production_idx, scenes_story_day_idx, scenes_list_idx, change_items_production_idx, change_items_group_idx,
      change_items_garment_idx, garments_fabric_idx, garments_search_idx, garments_status_sort_idx, garments_updated_idx, garments_rack_idx,
      garments_rental_due_idx, garments_category_idx, garments_name_idx;
    CREATE INDEX scenes_story_idx ON scenes (production_id, story_order);
    CREATE INDEX garments_production_idx ON garments (production_id, status);
  `);
};
