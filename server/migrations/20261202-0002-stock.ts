import type { QueryInterface } from 'sequelize';

/**
 * Stock: parts (every column of stock-csv.md, SI units, unit cost as an exact DECIMAL), the import
 * history and each import's per-part changes. Indexes serve the lookups the product makes: a part
 * by (part_number, location); parts by kind and value (snapping); by location and kind (filters).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE stock_imports (
      id BIGSERIAL PRIMARY KEY,
      user_id INTEGER REFERENCES users(id),
      status VARCHAR(16) NOT NULL CHECK (status IN ('applied', 'rejected')),
      file_name VARCHAR(255) NOT NULL,
      sha256 VARCHAR(64) NOT NULL,
      size_bytes INTEGER NOT NULL CHECK (size_bytes >= 0),
      mode VARCHAR(8) NOT NULL CHECK (mode IN ('merge', 'replace')),
      skip_invalid BOOLEAN NOT NULL,
      rows_read INTEGER NOT NULL,
      created_count INTEGER NOT NULL,
      updated_count INTEGER NOT NULL,
      unchanged_count INTEGER NOT NULL,
      zeroed_count INTEGER NOT NULL,
      rejected_count INTEGER NOT NULL,
      warning_count INTEGER NOT NULL,
      locations VARCHAR(64)[] NOT NULL,
      problems JSONB NOT NULL,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX stock_imports_created_at ON stock_imports (created_at DESC, id DESC);

    CREATE TABLE parts (
      id SERIAL PRIMARY KEY,
      part_number VARCHAR(64) NOT NULL CHECK (part_number <> ''),
      location VARCHAR(64) NOT NULL CHECK (location <> ''),
      kind VARCHAR(16) NOT NULL CHECK (kind IN ('capacitor', 'inductor')),
      value_si DOUBLE PRECISION NOT NULL CHECK (value_si > 0),
      tolerance_kind VARCHAR(8) NOT NULL CHECK (tolerance_kind IN ('relative', 'absolute')),
      tolerance_value DOUBLE PRECISION NOT NULL CHECK (tolerance_value > 0),
      srf_hz DOUBLE PRECISION CHECK (srf_hz > 0),
      q DOUBLE PRECISION CHECK (q > 0),
      q_frequency_hz DOUBLE PRECISION CHECK (q_frequency_hz > 0),
      esr_ohm DOUBLE PRECISION CHECK (esr_ohm > 0),
      quantity INTEGER NOT NULL CHECK (quantity >= 0),
      reserved INTEGER NOT NULL DEFAULT 0 CHECK (reserved >= 0),
      package VARCHAR(16),
      voltage_rating_v DOUBLE PRECISION CHECK (voltage_rating_v > 0),
      current_rating_a DOUBLE PRECISION CHECK (current_rating_a > 0),
      series VARCHAR(4) CHECK (series IN ('E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192')),
      unit_cost NUMERIC(12, 4) CHECK (unit_cost >= 0),
      manufacturer_part VARCHAR(100),
      description VARCHAR(500),
      last_import_id BIGINT REFERENCES stock_imports(id),
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT parts_part_number_location_key UNIQUE (part_number, location),
      CONSTRAINT parts_q_needs_frequency CHECK ((q IS NULL) = (q_frequency_hz IS NULL))
    );
    CREATE INDEX parts_kind_value ON parts (kind, value_si);
    CREATE INDEX parts_location_kind_value ON parts (location, kind, value_si);

    CREATE TABLE stock_import_changes (
      id BIGSERIAL PRIMARY KEY,
      import_id BIGINT NOT NULL REFERENCES stock_imports(id),
      part_id INTEGER NOT NULL REFERENCES parts(id),
      change VARCHAR(8) NOT NULL CHECK (change IN ('created', 'updated', 'zeroed')),
      quantity_before INTEGER,
      quantity_after INTEGER NOT NULL,
      before JSONB,
      after JSONB
    );
    CREATE INDEX stock_import_changes_import ON stock_import_changes (import_id, id);
    CREATE INDEX stock_import_changes_part ON stock_import_changes (part_id);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE stock_import_changes; DROP TABLE parts; DROP TABLE stock_imports;');
}
