CREATE TABLE "part_records" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"machine_id" uuid NOT NULL,
	"org_id" uuid NOT NULL,
	"place_key" text NOT NULL,
	"part_number" text NOT NULL,
	"installed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"installed_separator_hours" real,
	"origin" text NOT NULL,
	"previous_record_id" uuid,
	"carried_hours" real DEFAULT 0 NOT NULL,
	"removed_at" timestamp with time zone,
	"removed_separator_hours" real,
	"removed_to" text,
	"installed_by" uuid,
	"removed_by" uuid
);
--> statement-breakpoint
CREATE TABLE "wear_measurements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_record_id" uuid NOT NULL,
	"org_id" uuid NOT NULL,
	"inspection_id" uuid NOT NULL,
	"inspection_item_id" uuid NOT NULL,
	"wear_mm" real NOT NULL,
	"separator_hours" real,
	"measured_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "part_records" ADD CONSTRAINT "part_records_machine_id_machines_id_fk" FOREIGN KEY ("machine_id") REFERENCES "public"."machines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_records" ADD CONSTRAINT "part_records_org_id_organisations_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_records" ADD CONSTRAINT "part_records_installed_by_users_id_fk" FOREIGN KEY ("installed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_records" ADD CONSTRAINT "part_records_removed_by_users_id_fk" FOREIGN KEY ("removed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wear_measurements" ADD CONSTRAINT "wear_measurements_part_record_id_part_records_id_fk" FOREIGN KEY ("part_record_id") REFERENCES "public"."part_records"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wear_measurements" ADD CONSTRAINT "wear_measurements_org_id_organisations_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wear_measurements" ADD CONSTRAINT "wear_measurements_inspection_id_inspections_id_fk" FOREIGN KEY ("inspection_id") REFERENCES "public"."inspections"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wear_measurements" ADD CONSTRAINT "wear_measurements_inspection_item_id_inspection_items_id_fk" FOREIGN KEY ("inspection_item_id") REFERENCES "public"."inspection_items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "part_records_machine_idx" ON "part_records" USING btree ("machine_id","place_key","installed_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "part_records_shelf_idx" ON "part_records" USING btree ("org_id","part_number","removed_at" DESC NULLS LAST) WHERE "part_records"."removed_to" = 'shelf';--> statement-breakpoint
CREATE UNIQUE INDEX "part_records_previous_uq" ON "part_records" USING btree ("previous_record_id") WHERE "part_records"."previous_record_id" is not null;--> statement-breakpoint
CREATE INDEX "wear_measurements_record_idx" ON "wear_measurements" USING btree ("part_record_id","measured_at");--> statement-breakpoint
CREATE UNIQUE INDEX "wear_measurements_item_record_uq" ON "wear_measurements" USING btree ("inspection_item_id","part_record_id");--> statement-breakpoint
-- Hand-written: a starting record for every part of every layout installed before part history began.
INSERT INTO "part_records" ("machine_id", "org_id", "place_key", "part_number", "installed_at", "origin", "installed_by")
SELECT i."machine_id", m."org_id", p."place_key", p."part_number", i."updated_at", 'start', i."updated_by"
FROM "installed" i
JOIN "machines" m ON m."id" = i."machine_id"
CROSS JOIN LATERAL (
  SELECT 'element:' || (e->>'position') || ':' || (e->>'side') AS "place_key", e->>'partNumber' AS "part_number"
    FROM jsonb_array_elements(coalesce(i."layout"->'elements', '[]'::jsonb)) e
  UNION ALL
  SELECT 'cover:' || (c->>'section') || ':' || (c->>'side'), c->>'partNumber'
    FROM jsonb_array_elements(coalesce(i."layout"->'coverPlates', '[]'::jsonb)) c
  UNION ALL
  SELECT 'bar:' || (b->>'row') || ':' || (b->>'position'), b->>'partNumber'
    FROM jsonb_array_elements(coalesce(i."layout"->'rotorBars', '[]'::jsonb)) b
) p
WHERE p."part_number" IS NOT NULL;
