-- Every app server keeps the shops it has looked up by slug (with their catalog version) and
-- listens on the channel `shop_changed` to forget one the moment it changes: renamed, its catalog
-- version moved (db/queries/shop-directory.ts). The notice goes out when the change commits, and
-- carries only the shop's id.
CREATE OR REPLACE FUNCTION notify_shop_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  PERFORM pg_notify('shop_changed', coalesce(NEW.id, OLD.id));
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER shops_notify_changed AFTER UPDATE OR DELETE ON shops FOR EACH ROW EXECUTE FUNCTION notify_shop_changed();
