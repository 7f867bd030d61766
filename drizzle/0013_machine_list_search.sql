CREATE INDEX "machines_updated_idx" ON "machines" USING btree ("updated_at" DESC NULLS LAST,"id");--> statement-breakpoint
CREATE INDEX "machines_nickname_idx" ON "machines" USING btree ("nickname","id");--> statement-breakpoint
-- Hand-written: the machines list's text search reads one lower-case value per machine (name,
-- serial and notes joined by U+001F, which a search never contains) instead of case-folding three
-- columns per row. Not declared in src/db/schema (so no answer returning a machine row carries it).
ALTER TABLE "machines" ADD COLUMN "search_text" text GENERATED ALWAYS AS (lower("nickname" || chr(31) || "serial" || chr(31) || "notes")) STORED;
