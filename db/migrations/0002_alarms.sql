CREATE TYPE "public"."alarm_change" AS ENUM('opened', 'updated', 'acknowledged', 'cleared');--> statement-breakpoint
CREATE TYPE "public"."alarm_kind" AS ENUM('dew_risk', 'wet_surface', 'humid_air', 'sensor_silent', 'battery_low');--> statement-breakpoint
CREATE TABLE "alarm_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"alarm_id" uuid NOT NULL,
	"shop_id" uuid NOT NULL,
	"change" "alarm_change" NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"actor_id" uuid,
	"note" text,
	"snapshot" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "alarm_zone_states" (
	"zone_id" uuid PRIMARY KEY NOT NULL,
	"shop_id" uuid NOT NULL,
	"state" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "alarms" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"zone_id" uuid NOT NULL,
	"sensor_id" uuid,
	"subject_id" uuid NOT NULL,
	"kind" "alarm_kind" NOT NULL,
	"since_at" timestamp with time zone NOT NULL,
	"opened_at" timestamp with time zone NOT NULL,
	"updated_at" timestamp with time zone NOT NULL,
	"cleared_at" timestamp with time zone,
	"worst_margin_k" double precision,
	"latest_margin_k" double precision,
	"minutes_to_wet" double precision,
	"peak_rh_pct" double precision,
	"latest_rh_pct" double precision,
	"lowest_battery_v" double precision,
	"latest_battery_v" double precision,
	"acknowledged_by" uuid,
	"acknowledged_at" timestamp with time zone,
	"ack_note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "alarm_events" ADD CONSTRAINT "alarm_events_alarm_id_alarms_id_fk" FOREIGN KEY ("alarm_id") REFERENCES "public"."alarms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarm_events" ADD CONSTRAINT "alarm_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarm_zone_states" ADD CONSTRAINT "alarm_zone_states_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarms" ADD CONSTRAINT "alarms_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarms" ADD CONSTRAINT "alarms_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarms" ADD CONSTRAINT "alarms_sensor_id_sensors_id_fk" FOREIGN KEY ("sensor_id") REFERENCES "public"."sensors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alarms" ADD CONSTRAINT "alarms_acknowledged_by_users_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "alarm_events_alarm_id_at_index" ON "alarm_events" USING btree ("alarm_id","at");--> statement-breakpoint
CREATE INDEX "alarm_events_shop_id_at_index" ON "alarm_events" USING btree ("shop_id","at");--> statement-breakpoint
CREATE UNIQUE INDEX "alarms_one_open_per_subject" ON "alarms" USING btree ("subject_id","kind") WHERE "alarms"."cleared_at" is null;--> statement-breakpoint
CREATE INDEX "alarms_shop_id_opened_at_index" ON "alarms" USING btree ("shop_id","opened_at");--> statement-breakpoint
CREATE INDEX "alarms_zone_id_index" ON "alarms" USING btree ("zone_id") WHERE "alarms"."cleared_at" is null;