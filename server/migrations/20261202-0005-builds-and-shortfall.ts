import type { QueryInterface } from 'sequelize';

/**
 * Builds and shortfall lists: builds (a board quantity and its lifecycle), the saved matches a board
 * carries (with a snapshot of each match's design as it was planned), the reservations that hold
 * stock (one row per part of each element, with what is needed and what is held; `parts.reserved`
 * is their sum over held rows, kept in the same transactions), and the shortfall list of a build
 * with its lines. `match_id` has no foreign key: the snapshot keeps a build readable whatever
 * happens to the saved match.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE builds (
      id SERIAL PRIMARY KEY,
      name VARCHAR(200) NOT NULL CHECK (name <> ''),
      quantity INTEGER NOT NULL CHECK (quantity >= 1),
      status VARCHAR(16) NOT NULL CHECK (status IN ('planned', 'reserved', 'built', 'cancelled')),
      created_by INTEGER REFERENCES users(id) ON DELETE SET NULL,
      moves JSONB NOT NULL DEFAULT '[]',
      reserved_at TIMESTAMPTZ,
      built_at TIMESTAMPTZ,
      cancelled_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX builds_created_at ON builds (created_at DESC, id DESC);

    CREATE TABLE build_matches (
      id SERIAL PRIMARY KEY,
      build_id INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      match_id BIGINT NOT NULL,
      ordinal INTEGER NOT NULL,
      match_name VARCHAR(200) NOT NULL,
      design JSONB NOT NULL,
      CONSTRAINT build_matches_build_match_key UNIQUE (build_id, match_id)
    );

    CREATE TABLE reservations (
      id BIGSERIAL PRIMARY KEY,
      build_id INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      build_match_id INTEGER NOT NULL REFERENCES build_matches(id) ON DELETE CASCADE,
      match_id BIGINT NOT NULL,
      element_index INTEGER NOT NULL,
      position VARCHAR(8) NOT NULL CHECK (position IN ('series', 'shunt')),
      kind VARCHAR(16) NOT NULL CHECK (kind IN ('capacitor', 'inductor')),
      part_id INTEGER REFERENCES parts(id),
      part_number VARCHAR(64),
      location VARCHAR(64),
      per_board INTEGER NOT NULL CHECK (per_board >= 1),
      needed INTEGER NOT NULL CHECK (needed >= 0),
      quantity INTEGER NOT NULL CHECK (quantity >= 0 AND quantity <= needed),
      state VARCHAR(10) NOT NULL CHECK (state IN ('held', 'consumed', 'released')),
      moved_from JSONB,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT reservations_part_when_held CHECK (quantity = 0 OR part_id IS NOT NULL)
    );
    CREATE INDEX reservations_build ON reservations (build_id, id);
    CREATE INDEX reservations_held_part ON reservations (part_id) WHERE state = 'held';

    CREATE TABLE shortfall_lists (
      id SERIAL PRIMARY KEY,
      build_id INTEGER NOT NULL UNIQUE REFERENCES builds(id) ON DELETE CASCADE,
      status VARCHAR(16) NOT NULL CHECK (status IN ('draft', 'sent', 'ordered', 'received')),
      attrition_percent DOUBLE PRECISION NOT NULL CHECK (attrition_percent >= 0),
      loss_budget_db DOUBLE PRECISION NOT NULL CHECK (loss_budget_db > 0),
      usable_srf_fraction DOUBLE PRECISION NOT NULL CHECK (usable_srf_fraction > 0 AND usable_srf_fraction <= 1),
      sent_to TEXT,
      sent_at TIMESTAMPTZ,
      last_mail_id BIGINT REFERENCES outbound_mail(id) ON DELETE SET NULL,
      receipts JSONB NOT NULL DEFAULT '[]',
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX shortfall_lists_updated_at ON shortfall_lists (updated_at DESC, id DESC);

    CREATE TABLE shortfall_lines (
      id BIGSERIAL PRIMARY KEY,
      list_id INTEGER NOT NULL REFERENCES shortfall_lists(id) ON DELETE CASCADE,
      ordinal INTEGER NOT NULL,
      kind VARCHAR(16) NOT NULL CHECK (kind IN ('capacitor', 'inductor')),
      ideal_value DOUBLE PRECISION NOT NULL CHECK (ideal_value > 0),
      buy_value DOUBLE PRECISION NOT NULL CHECK (buy_value > 0),
      series VARCHAR(4) NOT NULL,
      quantity INTEGER NOT NULL CHECK (quantity >= 0),
      short_quantity INTEGER NOT NULL CHECK (short_quantity >= 0),
      min_srf_hz DOUBLE PRECISION NOT NULL CHECK (min_srf_hz > 0),
      tolerance_kind VARCHAR(8) NOT NULL CHECK (tolerance_kind IN ('relative', 'absolute')),
      tolerance_value DOUBLE PRECISION NOT NULL CHECK (tolerance_value >= 0),
      tolerance_code VARCHAR(8) NOT NULL,
      tolerance_within_budget BOOLEAN NOT NULL,
      package VARCHAR(16),
      reason VARCHAR(16) NOT NULL CHECK (reason IN ('short-stock', 'over-budget')),
      reason_text TEXT NOT NULL,
      buy_loss_db DOUBLE PRECISION,
      sources JSONB NOT NULL,
      received_quantity INTEGER NOT NULL DEFAULT 0 CHECK (received_quantity >= 0),
      CONSTRAINT shortfall_lines_list_ordinal_key UNIQUE (list_id, ordinal)
    );
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(
    'DROP TABLE shortfall_lines; DROP TABLE shortfall_lists; DROP TABLE reservations; DROP TABLE build_matches; DROP TABLE builds;',
  );
}
