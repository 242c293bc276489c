CREATE TYPE "public"."trial_test_kind" AS ENUM('condensation', 'standing_liquid', 'wear', 'humid_storage', 'other');--> statement-breakpoint
CREATE TABLE "trial_ranks" (
	"shop_id" uuid NOT NULL,
	"test_id" uuid NOT NULL,
	"treatment_id" uuid NOT NULL,
	"rank" numeric NOT NULL,
	CONSTRAINT "trial_ranks_test_id_treatment_id_pk" PRIMARY KEY("test_id","treatment_id")
);
--> statement-breakpoint
CREATE TABLE "trial_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"trial_id" uuid NOT NULL,
	"name" text NOT NULL,
	"kind" "trial_test_kind" NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"zone_id" uuid,
	"sensor_id" uuid,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "trial_treatments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"trial_id" uuid NOT NULL,
	"name" text NOT NULL,
	"position" integer NOT NULL,
	CONSTRAINT "trial_treatments_trialId_name_unique" UNIQUE("trial_id","name")
);
--> statement-breakpoint
CREATE TABLE "trials" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"name" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "trial_ranks" ADD CONSTRAINT "trial_ranks_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_ranks" ADD CONSTRAINT "trial_ranks_test_id_trial_tests_id_fk" FOREIGN KEY ("test_id") REFERENCES "public"."trial_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_ranks" ADD CONSTRAINT "trial_ranks_treatment_id_trial_treatments_id_fk" FOREIGN KEY ("treatment_id") REFERENCES "public"."trial_treatments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_tests" ADD CONSTRAINT "trial_tests_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_tests" ADD CONSTRAINT "trial_tests_trial_id_trials_id_fk" FOREIGN KEY ("trial_id") REFERENCES "public"."trials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_tests" ADD CONSTRAINT "trial_tests_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_tests" ADD CONSTRAINT "trial_tests_sensor_id_sensors_id_fk" FOREIGN KEY ("sensor_id") REFERENCES "public"."sensors"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_treatments" ADD CONSTRAINT "trial_treatments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trial_treatments" ADD CONSTRAINT "trial_treatments_trial_id_trials_id_fk" FOREIGN KEY ("trial_id") REFERENCES "public"."trials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trials" ADD CONSTRAINT "trials_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "trials" ADD CONSTRAINT "trials_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "trial_ranks_shop_id_index" ON "trial_ranks" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "trial_tests_trial_id_index" ON "trial_tests" USING btree ("trial_id");--> statement-breakpoint
CREATE INDEX "trial_tests_shop_id_index" ON "trial_tests" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "trial_treatments_shop_id_index" ON "trial_treatments" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "trials_shop_id_index" ON "trials" USING btree ("shop_id");