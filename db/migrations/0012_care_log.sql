CREATE TYPE "public"."care_kind" AS ENUM('coating', 'inspection');--> statement-breakpoint
CREATE TYPE "public"."coating_type" AS ENUM('wax', 'dry_film', 'inhibitor_spray', 'oil', 'other');--> statement-breakpoint
CREATE TABLE "care_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"surface_id" uuid NOT NULL,
	"kind" "care_kind" NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"by_user_id" uuid,
	"coating_type" "coating_type",
	"product" text,
	"rusting" smallint,
	"note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_entries_rusting_range" CHECK ("care_entries"."rusting" between 0 and 5),
	CONSTRAINT "care_entries_coating_kind" CHECK (("care_entries"."kind" = 'coating') = ("care_entries"."coating_type" is not null))
);
--> statement-breakpoint
CREATE TABLE "coating_budgets" (
	"shop_id" uuid NOT NULL,
	"coating" "coating_type" NOT NULL,
	"hours_wet" double precision NOT NULL,
	"hours_close" double precision NOT NULL,
	"tow_hours" double precision NOT NULL,
	CONSTRAINT "coating_budgets_shop_id_coating_pk" PRIMARY KEY("shop_id","coating")
);
--> statement-breakpoint
CREATE TABLE "surfaces" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"zone_id" uuid NOT NULL,
	"name" text NOT NULL,
	"material" text,
	"sensor_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "care_entries" ADD CONSTRAINT "care_entries_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_entries" ADD CONSTRAINT "care_entries_surface_id_surfaces_id_fk" FOREIGN KEY ("surface_id") REFERENCES "public"."surfaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_entries" ADD CONSTRAINT "care_entries_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coating_budgets" ADD CONSTRAINT "coating_budgets_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surfaces" ADD CONSTRAINT "surfaces_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surfaces" ADD CONSTRAINT "surfaces_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surfaces" ADD CONSTRAINT "surfaces_sensor_id_sensors_id_fk" FOREIGN KEY ("sensor_id") REFERENCES "public"."sensors"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "care_entries_surface_id_at_index" ON "care_entries" USING btree ("surface_id","at");--> statement-breakpoint
CREATE INDEX "surfaces_shop_id_index" ON "surfaces" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "surfaces_zone_id_index" ON "surfaces" USING btree ("zone_id");