CREATE TABLE "dealer_prices" (
	"dealer_id" uuid NOT NULL,
	"part_number" text NOT NULL,
	"price_cents" integer NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "dealer_prices_dealer_id_part_number_pk" PRIMARY KEY("dealer_id","part_number")
);
--> statement-breakpoint
ALTER TABLE "dealer_prices" ADD CONSTRAINT "dealer_prices_dealer_id_organisations_id_fk" FOREIGN KEY ("dealer_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dealer_prices" ADD CONSTRAINT "dealer_prices_part_number_catalog_parts_part_number_fk" FOREIGN KEY ("part_number") REFERENCES "public"."catalog_parts"("part_number") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
-- Hand-written: the role `admin` is split; existing administrators run their dealer.
UPDATE "memberships" SET "role" = 'dealer_admin' WHERE "role" = 'admin';--> statement-breakpoint
-- Hand-written: every existing dealer starts its own price list at today's catalog prices.
INSERT INTO "dealer_prices" ("dealer_id", "part_number", "price_cents")
SELECT o."id", p."part_number", (p."spec"->>'priceCents')::integer
FROM "organisations" o CROSS JOIN "catalog_parts" p
WHERE o."kind" = 'dealer' AND p."spec" ? 'priceCents'
ON CONFLICT DO NOTHING;
