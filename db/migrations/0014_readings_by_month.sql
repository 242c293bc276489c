-- Readings partitioned by month on `at`, managed by pg_partman 4.x (Debian's
-- postgresql-15-partman; scripts/db.sh installs it). Why: raw readings are the one table that
-- grows without end (a sensor a minute is 525,600 rows a year); by month, retention drops a
-- whole partition instead of deleting rows (server/jobs/readingPartitionsJob.ts), and a zone's
-- history or a week report reads only the months it spans.
--
-- The key becomes (shop_id, sensor_id, at): a partitioned table's key must hold its partition
-- column, and with the shop first a distributed PostgreSQL can shard readings by shop without a
-- schema change. The foreign key to sensors goes (db/schema/sensing.ts says why); the trigger at
-- the end keeps its cascade.
--
-- An existing database is converted in place: the old table is renamed, the partitioned parent
-- made with partitions from the month of its oldest reading to three months ahead (and the
-- default partition pg_partman adds), every row copied in, the old table dropped. Drizzle runs
-- migrations in one transaction, so a failure leaves the old table as it was; the copy holds
-- the table locked, as every migration runs before the server starts.
CREATE SCHEMA IF NOT EXISTS partman;--> statement-breakpoint
CREATE EXTENSION IF NOT EXISTS pg_partman SCHEMA partman;--> statement-breakpoint
-- pg_partman truncates and names months in the session's time zone: months are UTC months here
-- whatever the server's TimeZone (db/queries/readingPartitions.ts does the same).
SET LOCAL TIME ZONE 'UTC';--> statement-breakpoint
ALTER TABLE "readings" RENAME TO "readings_unpartitioned";--> statement-breakpoint
ALTER INDEX "readings_zone_id_at_index" RENAME TO "readings_unpartitioned_zone_id_at_index";--> statement-breakpoint
ALTER TABLE "readings_unpartitioned" DROP CONSTRAINT "readings_sensor_id_sensors_id_fk";--> statement-breakpoint
CREATE TABLE "readings" (
	"sensor_id" uuid NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"shop_id" uuid NOT NULL,
	"zone_id" uuid NOT NULL,
	"air_c" double precision NOT NULL,
	"rh_pct" double precision NOT NULL,
	"surface_c" double precision,
	"surface_source" "surface_source",
	"battery_v" double precision,
	"dew_point_c" double precision,
	"margin_k" double precision,
	"emc_pct" double precision,
	"level" "level" NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "readings_shop_id_sensor_id_at_pk" PRIMARY KEY("shop_id","sensor_id","at")
) PARTITION BY RANGE ("at");--> statement-breakpoint
-- Migration 0010's covering index, on the parent: every partition gets its own.
CREATE INDEX "readings_zone_id_at_index" ON "readings" USING btree ("zone_id", "at")
  INCLUDE ("sensor_id", "air_c", "rh_pct", "surface_c", "dew_point_c", "margin_k", "emc_pct", "level");--> statement-breakpoint
-- From the oldest reading's month (or three months back on an empty table, pg_partman's own
-- start) to three months ahead.
SELECT partman.create_parent(
  p_parent_table => 'public.readings',
  p_control => 'at',
  p_type => 'native',
  p_interval => 'monthly',
  p_premake => 3,
  p_start_partition => (
    SELECT least(min("at"), now() - interval '3 months')::text FROM "readings_unpartitioned"
  )
);--> statement-breakpoint
-- infinite_time_partitions: keep three months made ahead even when no reading arrives (a shop
-- whose sensors are all away must not find its next month missing). retention_keep_table false:
-- retention drops a partition rather than detaching it; the job sets the retention itself.
UPDATE partman.part_config
SET infinite_time_partitions = true, retention_keep_table = false
WHERE parent_table = 'public.readings';--> statement-breakpoint
INSERT INTO "readings" ("sensor_id", "at", "shop_id", "zone_id", "air_c", "rh_pct", "surface_c",
  "surface_source", "battery_v", "dew_point_c", "margin_k", "emc_pct", "level", "received_at")
SELECT "sensor_id", "at", "shop_id", "zone_id", "air_c", "rh_pct", "surface_c",
  "surface_source", "battery_v", "dew_point_c", "margin_k", "emc_pct", "level", "received_at"
FROM "readings_unpartitioned";--> statement-breakpoint
-- A reading stamped beyond the premade months (the ingest checks refuse more than 5 min ahead,
-- so only hand-made rows) landed in the default partition: give it its month, as pg_partman's
-- maintenance cannot make a partition while the default holds rows of its range.
SELECT partman.partition_data_time('public.readings', p_batch_count => 100000);--> statement-breakpoint
DROP TABLE "readings_unpartitioned";--> statement-breakpoint
-- The cascade the foreign key gave: a sensor deleted (with its zone or its shop; an owner only
-- ever marks one removed) takes its readings, found through the key's (shop_id, sensor_id)
-- prefix in each partition.
CREATE FUNCTION "readings_follow_sensor"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM "readings" WHERE "shop_id" = OLD."shop_id" AND "sensor_id" = OLD."id";
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER "readings_follow_sensor" AFTER DELETE ON "sensors"
  FOR EACH ROW EXECUTE FUNCTION "readings_follow_sensor"();
