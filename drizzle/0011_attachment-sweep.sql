-- The sweep of uploads never attached to a request (lib/attachments/sweep.ts): in every shop, the
-- ids, shops and storage keys of files older than the given age with no request, oldest first. The
-- sweep then deletes each in its own shop's scope (withShop), where the policy holds.
CREATE OR REPLACE FUNCTION stale_unlinked_attachments(older_than_seconds double precision, max_rows integer)
RETURNS TABLE (id uuid, shop_id text, storage_key text)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT a.id, a.shop_id, a.storage_key FROM request_attachments a
  WHERE a.request_id IS NULL AND a.created_at < now() - make_interval(secs => older_than_seconds)
  ORDER BY a.created_at
  LIMIT least(greatest(max_rows, 0), 5000)
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION stale_unlinked_attachments(double precision, integer) FROM PUBLIC;
