ALTER TABLE "parts_requests" ADD COLUMN "fit_layout" jsonb;--> statement-breakpoint
ALTER TABLE "parts_requests" ADD COLUMN "fit_override" jsonb;