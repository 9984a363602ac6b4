-- A shop's catalog version moves with every change to what its arrangement search reads, whoever
-- makes it (the app, an import, a person at psql), so an app server may keep a loaded catalog for
-- exactly as long as the version it read with it is current (db/queries/catalog.ts). One UPDATE per
-- statement and shop, through transition tables, so an import of a thousand rows bumps it once.
-- A later table the search reads gets the same three triggers: SELECT track_catalog_changes('t').
CREATE OR REPLACE FUNCTION bump_catalog_version() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  UPDATE shops SET catalog_version = catalog_version + 1 WHERE id IN (SELECT DISTINCT shop_id FROM changed);
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION track_catalog_changes(t regclass) RETURNS void
LANGUAGE plpgsql AS $$
DECLARE
  name text := (SELECT relname FROM pg_class WHERE oid = t);
BEGIN
  EXECUTE format('DROP TRIGGER IF EXISTS %I ON %s', name || '_catalog_version_ins', t);
  EXECUTE format('DROP TRIGGER IF EXISTS %I ON %s', name || '_catalog_version_upd', t);
  EXECUTE format('DROP TRIGGER IF EXISTS %I ON %s', name || '_catalog_version_del', t);
  EXECUTE format('CREATE TRIGGER %I AFTER INSERT ON %s REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION bump_catalog_version()', name || '_catalog_version_ins', t);
  EXECUTE format('CREATE TRIGGER %I AFTER UPDATE ON %s REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION bump_catalog_version()', name || '_catalog_version_upd', t);
  EXECUTE format('CREATE TRIGGER %I AFTER DELETE ON %s REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION bump_catalog_version()', name || '_catalog_version_del', t);
END
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION track_catalog_changes(regclass) FROM PUBLIC;
--> statement-breakpoint
SELECT track_catalog_changes('catalog_cells');
--> statement-breakpoint
SELECT track_catalog_changes('catalog_components');
--> statement-breakpoint
SELECT track_catalog_changes('shop_settings');
--> statement-breakpoint
-- Rate-limit counters are written on every limited request: kept out of the write-ahead log they
-- cost no disk flush per request. A crash of the database empties them (every window starts anew),
-- and standbys do not have them, which is what a limiter can afford.
ALTER TABLE rate_limits SET UNLOGGED;
