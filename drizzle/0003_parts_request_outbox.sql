ALTER TABLE "parts_requests" ADD COLUMN "sending_since" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "parts_requests" ADD COLUMN "send_error" text;