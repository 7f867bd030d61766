DROP INDEX "machines_org_updated_idx";--> statement-breakpoint
DROP INDEX "machines_updated_idx";--> statement-breakpoint
CREATE INDEX "machines_org_updated_idx" ON "machines" USING btree ("org_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "machines_updated_idx" ON "machines" USING btree ("updated_at","id");