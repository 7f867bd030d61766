ALTER TABLE "installed" ADD COLUMN "source_layout_id" uuid;--> statement-breakpoint
ALTER TABLE "installed" ADD COLUMN "source_version" integer;