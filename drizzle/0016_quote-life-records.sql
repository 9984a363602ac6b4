-- Every existing quote gets the moves that led to its state, so each revision's state reads from
-- quote_moves like a new quote's: its revisions were sent; earlier ones were replaced by the next;
-- the latest one moved on to the quote's state when that is not "sent" any more.
INSERT INTO "quote_moves" ("shop_id", "quote_id", "revision", "from_status", "to_status", "actor", "created_at")
SELECT r."shop_id", r."quote_id", r."revision", NULL, 'sent', 'system', r."created_at"
FROM "quote_revisions" r;
--> statement-breakpoint
INSERT INTO "quote_moves" ("shop_id", "quote_id", "revision", "from_status", "to_status", "actor", "created_at")
SELECT r."shop_id", r."quote_id", r."revision", 'sent', 'superseded', 'system', r."created_at"
FROM "quote_revisions" r
JOIN "quotes" q ON q."shop_id" = r."shop_id" AND q."id" = r."quote_id"
WHERE r."revision" < q."current_revision";
--> statement-breakpoint
INSERT INTO "quote_moves" ("shop_id", "quote_id", "revision", "from_status", "to_status", "actor", "created_at")
SELECT q."shop_id", q."id", q."current_revision", 'sent', q."status", 'system', q."updated_at"
FROM "quotes" q
WHERE q."status" <> 'sent';
--> statement-breakpoint
-- Frozen and append-only records: a row of these tables never changes once written. The columns
-- named in the trigger's arguments may still be set to NULL by their foreign key (ON DELETE SET NULL).
CREATE OR REPLACE FUNCTION "refuse_change_of_frozen_row"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  before jsonb := to_jsonb(OLD);
  after jsonb := to_jsonb(NEW);
  col text;
BEGIN
  FOREACH col IN ARRAY TG_ARGV LOOP
    IF after -> col = 'null'::jsonb THEN
      before := before - col;
      after := after - col;
    END IF;
  END LOOP;
  IF before IS DISTINCT FROM after THEN
    RAISE EXCEPTION 'rows of % are frozen and cannot be changed', TG_TABLE_NAME USING ERRCODE = 'restrict_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER "quote_revisions_frozen" BEFORE UPDATE ON "quote_revisions" FOR EACH ROW EXECUTE FUNCTION "refuse_change_of_frozen_row"('created_by_user_id');
--> statement-breakpoint
CREATE TRIGGER "quote_lines_frozen" BEFORE UPDATE ON "quote_lines" FOR EACH ROW EXECUTE FUNCTION "refuse_change_of_frozen_row"();
--> statement-breakpoint
CREATE TRIGGER "quote_moves_frozen" BEFORE UPDATE ON "quote_moves" FOR EACH ROW EXECUTE FUNCTION "refuse_change_of_frozen_row"('actor_user_id');
--> statement-breakpoint
CREATE TRIGGER "quote_messages_frozen" BEFORE UPDATE ON "quote_messages" FOR EACH ROW EXECUTE FUNCTION "refuse_change_of_frozen_row"('author_user_id');
