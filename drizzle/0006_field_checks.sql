CREATE TABLE "loss_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"machine_id" uuid NOT NULL,
	"org_id" uuid NOT NULL,
	"field_name" text NOT NULL,
	"checked_at" timestamp with time zone NOT NULL,
	"crop" text NOT NULL,
	"moisture_pct" real,
	"layout_id" uuid,
	"layout_version" integer,
	"rotor_rpm" integer NOT NULL,
	"clearance_mm" real NOT NULL,
	"vane_setting" text NOT NULL,
	"fan_rpm" integer,
	"upper_sieve_mm" real,
	"lower_sieve_mm" real,
	"input" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"harvest_bu_per_ac" real NOT NULL,
	"harvest_pct" real NOT NULL,
	"verdict" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "starting_values" (
	"dealer_id" uuid NOT NULL,
	"family_id" text NOT NULL,
	"crop" text NOT NULL,
	"fan_rpm" integer,
	"upper_sieve_mm" real,
	"lower_sieve_mm" real,
	"feeder_note" text DEFAULT '' NOT NULL,
	"header_note" text DEFAULT '' NOT NULL,
	"invented" boolean DEFAULT false NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "starting_values_dealer_id_family_id_crop_pk" PRIMARY KEY("dealer_id","family_id","crop")
);
--> statement-breakpoint
ALTER TABLE "loss_checks" ADD CONSTRAINT "loss_checks_machine_id_machines_id_fk" FOREIGN KEY ("machine_id") REFERENCES "public"."machines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loss_checks" ADD CONSTRAINT "loss_checks_org_id_organisations_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loss_checks" ADD CONSTRAINT "loss_checks_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "starting_values" ADD CONSTRAINT "starting_values_dealer_id_organisations_id_fk" FOREIGN KEY ("dealer_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "starting_values" ADD CONSTRAINT "starting_values_family_id_families_id_fk" FOREIGN KEY ("family_id") REFERENCES "public"."families"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "starting_values" ADD CONSTRAINT "starting_values_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "loss_checks_machine_idx" ON "loss_checks" USING btree ("machine_id","checked_at");