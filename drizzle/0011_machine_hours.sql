CREATE TABLE "machine_hours" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"machine_id" uuid NOT NULL,
	"org_id" uuid NOT NULL,
	"engine_hours" real NOT NULL,
	"separator_hours" real NOT NULL,
	"source" text NOT NULL,
	"source_id" uuid,
	"correction_reason" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "machine_hours" ADD CONSTRAINT "machine_hours_machine_id_machines_id_fk" FOREIGN KEY ("machine_id") REFERENCES "public"."machines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_hours" ADD CONSTRAINT "machine_hours_org_id_organisations_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_hours" ADD CONSTRAINT "machine_hours_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "machine_hours_machine_idx" ON "machine_hours" USING btree ("machine_id","recorded_at" DESC NULLS LAST);