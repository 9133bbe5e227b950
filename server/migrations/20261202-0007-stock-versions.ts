import type { QueryInterface } from 'sequelize';

/**
 * A version number of the stock per location ('' for all locations), raised by PostgreSQL itself
 * whenever a statement changes `parts`, so a solve can ask "has the stock I indexed changed?" in one
 * row read. Before, it summed a hash of every part row per solve: about 0.4 s of database time for
 * 100,000 parts (measured with psql on the stock-import bench's data), on every solve.
 *
 * Statement-level triggers with transition tables (PostgreSQL 10 and later; one event per trigger
 * when it has transition tables) bump the row of every location the statement's old or new rows
 * are at, and '' always; TRUNCATE bumps every row. Versions follow commit order: the UPDATE of a
 * version row holds its lock to the end of the writing transaction, so a second writer waits at
 * the '' row (bumped first by every statement, so the rows are always taken in one order and
 * cannot deadlock) until the first commits, then counts on from its value. A reader that sees
 * version v of a location therefore sees exactly the writes of the transactions that made versions
 * up to v. Every writer of `parts` already takes the stock advisory lock first, shared or exclusive
 * (build-lifecycle-lock.ts), and locks its part rows before it writes them.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE stock_versions (
      location VARCHAR(64) PRIMARY KEY,
      version BIGINT NOT NULL CHECK (version > 0)
    );
    INSERT INTO stock_versions (location, version) SELECT '', 1 UNION SELECT DISTINCT location, 1 FROM parts;

    CREATE FUNCTION stock_versions_bump(locations TEXT[]) RETURNS VOID LANGUAGE sql AS $$
      INSERT INTO stock_versions AS v (location, version)
        SELECT l, 1 FROM (SELECT DISTINCT unnest(locations || ''::text) AS l) AS touched ORDER BY l
      ON CONFLICT (location) DO UPDATE SET version = v.version + 1
    $$;
    CREATE FUNCTION parts_inserted() RETURNS TRIGGER LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM stock_versions_bump(ARRAY(SELECT DISTINCT location::text FROM new_rows));
      RETURN NULL;
    END $$;
    CREATE FUNCTION parts_updated() RETURNS TRIGGER LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM stock_versions_bump(ARRAY(SELECT location::text FROM old_rows UNION SELECT location::text FROM new_rows));
      RETURN NULL;
    END $$;
    CREATE FUNCTION parts_deleted() RETURNS TRIGGER LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM stock_versions_bump(ARRAY(SELECT DISTINCT location::text FROM old_rows));
      RETURN NULL;
    END $$;
    CREATE FUNCTION parts_truncated() RETURNS TRIGGER LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM stock_versions_bump(ARRAY(SELECT location::text FROM stock_versions));
      RETURN NULL;
    END $$;

    CREATE TRIGGER parts_inserted AFTER INSERT ON parts REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION parts_inserted();
    CREATE TRIGGER parts_updated AFTER UPDATE ON parts REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION parts_updated();
    CREATE TRIGGER parts_deleted AFTER DELETE ON parts REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION parts_deleted();
    CREATE TRIGGER parts_truncated AFTER TRUNCATE ON parts FOR EACH STATEMENT EXECUTE FUNCTION parts_truncated();
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TRIGGER parts_truncated ON parts;
    DROP TRIGGER parts_deleted ON parts;
    DROP TRIGGER parts_updated ON parts;
    DROP TRIGGER parts_inserted ON parts;
    DROP FUNCTION parts_truncated();
    DROP FUNCTION parts_deleted();
    DROP FUNCTION parts_updated();
    DROP FUNCTION parts_inserted();
    DROP FUNCTION stock_versions_bump(TEXT[]);
    DROP TABLE stock_versions;
  `);
}
