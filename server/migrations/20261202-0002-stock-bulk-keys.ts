import type { QueryInterface } from 'sequelize';

/**
 * Bulk-write keys of the stock tables, measured on 100,000-row imports (bench/stock-import-bench.ts):
 * - drops the foreign keys that cost one lookup per written row (`parts.last_import_id`,
 *   `stock_import_changes.import_id` and `.part_id`); the import writes these columns itself, in
 *   the transaction that creates the rows they point to, and parts and imports are never deleted,
 *   so the references stay whole;
 * - one index fewer on `parts`: the unique key becomes (location, part_number), which also serves
 *   lookups by location, so (location, kind, value_si) goes; (kind, value_si) stays for lookups by
 *   kind and value;
 * - fillfactor 85 on `parts`, so a new count (quantity only, no indexed column) is a HOT update that
 *   writes no index entries.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE parts DROP CONSTRAINT IF EXISTS parts_last_import_id_fkey;
    ALTER TABLE stock_import_changes DROP CONSTRAINT IF EXISTS stock_import_changes_import_id_fkey;
    ALTER TABLE stock_import_changes DROP CONSTRAINT IF EXISTS stock_import_changes_part_id_fkey;
    ALTER TABLE parts DROP CONSTRAINT parts_part_number_location_key;
    ALTER TABLE parts ADD CONSTRAINT parts_location_part_number_key UNIQUE (location, part_number);
    DROP INDEX parts_location_kind_value;
    ALTER TABLE parts SET (fillfactor = 85);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE parts RESET (fillfactor);
    CREATE INDEX parts_location_kind_value ON parts (location, kind, value_si);
    ALTER TABLE parts DROP CONSTRAINT parts_location_part_number_key;
    ALTER TABLE parts ADD CONSTRAINT parts_part_number_location_key UNIQUE (part_number, location);
    ALTER TABLE parts ADD CONSTRAINT parts_last_import_id_fkey FOREIGN KEY (last_import_id) REFERENCES stock_imports(id);
    ALTER TABLE stock_import_changes ADD CONSTRAINT stock_import_changes_import_id_fkey FOREIGN KEY (import_id) REFERENCES stock_imports(id);
    ALTER TABLE stock_import_changes ADD CONSTRAINT stock_import_changes_part_id_fkey FOREIGN KEY (part_id) REFERENCES parts(id);
  `);
}
