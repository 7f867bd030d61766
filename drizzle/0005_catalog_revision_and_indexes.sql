CREATE TABLE "catalog_revision" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"revision" bigint DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE INDEX "machines_org_updated_idx" ON "machines" USING btree ("org_id","updated_at" DESC NULLS LAST,"id");--> statement-breakpoint
CREATE INDEX "machines_org_nickname_idx" ON "machines" USING btree ("org_id","nickname","id");--> statement-breakpoint
CREATE INDEX "audit_log_entity_idx" ON "audit_log" USING btree ("entity_id","at");--> statement-breakpoint
-- Hand-written: the single row, and statement triggers that count every change to the catalog tables.
INSERT INTO "catalog_revision" ("id", "revision") VALUES (1, 0) ON CONFLICT DO NOTHING;--> statement-breakpoint
CREATE OR REPLACE FUNCTION catalog_revision_bump() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE "catalog_revision" SET "revision" = "revision" + 1 WHERE "id" = 1;
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER families_catalog_revision AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "families" FOR EACH STATEMENT EXECUTE FUNCTION catalog_revision_bump();--> statement-breakpoint
CREATE TRIGGER catalog_parts_catalog_revision AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "catalog_parts" FOR EACH STATEMENT EXECUTE FUNCTION catalog_revision_bump();
