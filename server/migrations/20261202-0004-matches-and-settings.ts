import type { QueryInterface } from 'sequelize';

/**
 * Saved matches and the organisation settings.
 *
 * `matches`: a name, who saved it, the solve request as given, which fit was chosen (placement,
 * solution, rank), the chosen fit with its results as computed then, the ideal network, the objective
 * and settings it was ranked with, and a snapshot of every stocked part the fit uses (so a saved match
 * reopens with the same numbers however the stock changes; `part_ids` serves lookups by part).
 *
 * `organisation_settings`: one row (id 1, enforced) holding the settings of shared/api/settings.ts,
 * created with the defaults.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE matches (
      id SERIAL PRIMARY KEY,
      name VARCHAR(200) NOT NULL CHECK (name <> ''),
      created_by INTEGER REFERENCES users(id) ON DELETE SET NULL,
      request JSONB NOT NULL,
      placement VARCHAR(16) NOT NULL CHECK (placement IN ('shunt-at-load', 'shunt-at-source')),
      solution SMALLINT NOT NULL CHECK (solution IN (1, 2)),
      rank INTEGER NOT NULL CHECK (rank >= 1),
      objective VARCHAR(16) NOT NULL CHECK (objective IN ('worst-case', 'nominal', 'band')),
      fit JSONB NOT NULL,
      network JSONB NOT NULL,
      settings JSONB NOT NULL,
      parts JSONB NOT NULL,
      part_ids INTEGER[] NOT NULL,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX matches_created_at ON matches (created_at DESC, id DESC);
    CREATE INDEX matches_part_ids ON matches USING GIN (part_ids);

    CREATE TABLE organisation_settings (
      id SMALLINT PRIMARY KEY DEFAULT 1 CHECK (id = 1),
      usable_srf_fraction DOUBLE PRECISION NOT NULL DEFAULT 0.5 CHECK (usable_srf_fraction > 0 AND usable_srf_fraction <= 1),
      exclude_above_limit BOOLEAN NOT NULL DEFAULT false,
      default_objective VARCHAR(16) NOT NULL DEFAULT 'worst-case' CHECK (default_objective IN ('worst-case', 'nominal', 'band')),
      loss_budget_db DOUBLE PRECISION NOT NULL DEFAULT 0.5 CHECK (loss_budget_db > 0 AND loss_budget_db <= 20),
      preferred_series_capacitor VARCHAR(4) NOT NULL DEFAULT 'E24' CHECK (preferred_series_capacitor IN ('E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192')),
      preferred_series_inductor VARCHAR(4) NOT NULL DEFAULT 'E12' CHECK (preferred_series_inductor IN ('E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192')),
      attrition_percent DOUBLE PRECISION NOT NULL DEFAULT 5 CHECK (attrition_percent >= 0 AND attrition_percent <= 100),
      updated_by INTEGER REFERENCES users(id) ON DELETE SET NULL,
      updated_at TIMESTAMPTZ
    );
    INSERT INTO organisation_settings (id) VALUES (1);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE organisation_settings; DROP TABLE matches;');
}
