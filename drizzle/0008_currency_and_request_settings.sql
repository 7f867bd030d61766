ALTER TABLE "organisations" ADD COLUMN "currency" text;--> statement-breakpoint
ALTER TABLE "parts_requests" ADD COLUMN "settings" jsonb;