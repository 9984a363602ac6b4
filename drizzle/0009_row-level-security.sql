-- Row-level security: every tenant table (every table with a shop_id column) shows and takes only
-- the rows of the shop its transaction is scoped to (withShop in db/tx.ts sets app.shop_id).
-- ENABLE applies the policies to the app's role; FORCE applies them to the tables' owner too, so
-- only a role with BYPASSRLS (the migration role: seed, backups, these functions) sees across shops.
-- See DEVELOPERS.md, "Row-level security".

-- The shop of the running transaction. Neither a shop nor a person set: the query forgot withShop,
-- and fails loudly instead of quietly answering nothing.
CREATE OR REPLACE FUNCTION app_shop_id() RETURNS text
LANGUAGE plpgsql STABLE PARALLEL SAFE AS $$
DECLARE
  shop text := nullif(current_setting('app.shop_id', true), '');
BEGIN
  IF shop IS NULL AND nullif(current_setting('app.user_id', true), '') IS NULL THEN
    RAISE EXCEPTION 'tenant table used outside withShop (app.shop_id is not set)'
      USING ERRCODE = '42501', HINT = 'Run the query inside withShop(shopId, fn) from db/tx.ts.';
  END IF;
  RETURN shop;
END
$$;
--> statement-breakpoint

-- Puts one table under the shop policy; later migrations call it for each new tenant table.
CREATE OR REPLACE FUNCTION enable_shop_isolation(t regclass) RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  EXECUTE format('ALTER TABLE %s ENABLE ROW LEVEL SECURITY', t);
  EXECUTE format('ALTER TABLE %s FORCE ROW LEVEL SECURITY', t);
  EXECUTE format('DROP POLICY IF EXISTS shop_isolation ON %s', t);
  EXECUTE format('CREATE POLICY shop_isolation ON %s USING (shop_id = app_shop_id()) WITH CHECK (shop_id = app_shop_id())', t);
END
$$;
--> statement-breakpoint

DO $$
DECLARE
  t regclass;
BEGIN
  FOR t IN
    SELECT format('%I.%I', c.table_schema, c.table_name)::regclass
    FROM information_schema.columns c
    JOIN information_schema.tables tb ON tb.table_schema = c.table_schema AND tb.table_name = c.table_name
    WHERE c.table_schema = 'public' AND c.column_name = 'shop_id' AND tb.table_type = 'BASE TABLE'
  LOOP
    PERFORM enable_shop_isolation(t);
  END LOOP;
END
$$;
--> statement-breakpoint

-- "My shops": a person sees their own memberships in every shop (withUser sets app.user_id).
CREATE POLICY own_memberships ON members FOR SELECT USING (user_id = nullif(current_setting('app.user_id', true), ''));
--> statement-breakpoint

-- The landing page's shop list: public storefront facts of every shop, nothing else.
CREATE OR REPLACE FUNCTION public_shop_list(max_rows integer)
RETURNS TABLE (slug text, name text, tagline text, currency text)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT s.slug, s.name, coalesce(ss.tagline, ''), coalesce(ss.currency, 'EUR')
  FROM shops s LEFT JOIN shop_settings ss ON ss.shop_id = s.id
  ORDER BY s.name
  LIMIT least(greatest(max_rows, 0), 500)
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION public_shop_list(integer) FROM PUBLIC;
--> statement-breakpoint

-- The e-mail dispatcher: ids of waiting outbox rows in every shop (it then sends each in withShop).
CREATE OR REPLACE FUNCTION waiting_outbox(max_rows integer)
RETURNS TABLE (id uuid, shop_id text)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT o.id, o.shop_id FROM email_outbox o
  WHERE o.status = 'waiting'
  ORDER BY o.created_at
  LIMIT least(greatest(max_rows, 0), 5000)
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION waiting_outbox(integer) FROM PUBLIC;
--> statement-breakpoint
REVOKE ALL ON FUNCTION enable_shop_isolation(regclass) FROM PUBLIC;
