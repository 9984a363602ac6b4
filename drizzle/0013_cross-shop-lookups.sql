-- Two more reads across shops, each for one caller that is never a member (as waiting_outbox in
-- 0009_row-level-security.sql): they hand out ids and shops only; the caller then reads and writes
-- each row inside withShop of its shop, where the policies hold.

-- The webhook worker (lib/webhooks/worker.ts): deliveries due now in every shop, oldest first.
CREATE OR REPLACE FUNCTION due_webhook_deliveries(max_rows integer)
RETURNS TABLE (id uuid, shop_id text)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT d.id, d.shop_id FROM webhook_deliveries d
  WHERE d.state IN ('waiting', 'retrying') AND d.next_attempt_at <= now()
  ORDER BY d.next_attempt_at
  LIMIT least(greatest(max_rows, 0), 5000)
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION due_webhook_deliveries(integer) FROM PUBLIC;
--> statement-breakpoint

-- The payment webhook (lib/payments/events.ts): the shop and payment of a payment intent, for an
-- event that carries no metadata of ours (a refund made at the payment service).
CREATE OR REPLACE FUNCTION payment_of_intent(intent text)
RETURNS TABLE (shop_id text, payment_id uuid)
LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public, pg_temp AS $$
  SELECT p.shop_id, p.id FROM payments p WHERE p.stripe_payment_intent_id = intent LIMIT 1
$$;
--> statement-breakpoint
REVOKE ALL ON FUNCTION payment_of_intent(text) FROM PUBLIC;
