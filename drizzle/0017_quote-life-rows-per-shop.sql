-- The life of a quote's tables are tenant tables: each shows and takes only the rows of the shop
-- its transaction is scoped to, as every other (0009_row-level-security.sql).
SELECT enable_shop_isolation('quote_moves');
--> statement-breakpoint
SELECT enable_shop_isolation('quote_messages');
--> statement-breakpoint
SELECT enable_shop_isolation('quote_drafts');
--> statement-breakpoint

-- The expiry job (lib/quoting/lifecycle.ts): sent quotes whose latest revision's last valid day is
-- before `today`, in every shop; ids and shops only, each then expired inside withShop of its shop.
CREATE OR REPLACE FUNCTION quotes_past_validity(today date, max_rows integer)
RETURNS TABLE (shop_id text, number text)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT q.shop_id, q.number FROM quotes q
  JOIN quote_revisions r ON r.shop_id = q.shop_id AND r.quote_id = q.id AND r.revision = q.current_revision
  WHERE q.status = 'sent' AND r.valid_until < today
  ORDER BY r.valid_until
  LIMIT least(greatest(max_rows, 0), 5000)
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION quotes_past_validity(date, integer) FROM PUBLIC;
