-- Quotes were "issued" before a quote had a life of moves; an issued quote is a sent one. Renaming
-- the enum value keeps every existing row's meaning (accepted, expired and withdrawn keep theirs)
-- before the next migration rebuilds the type with the new states.
ALTER TYPE "public"."quote_status" RENAME VALUE 'issued' TO 'sent';
