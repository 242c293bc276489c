-- The zone history's query (db/queries/readings.ts querySeries) reads a zone's week: 20,000
-- readings from two sensors posting each minute. Through the plain (zone_id, at) index each one
-- is a heap fetch from a different page (readings arrive interleaved from every sensor), ~200 ms
-- at 10 M rows; with the chart's columns in the index it is an index-only scan of ~260 pages.
-- Same name and key as before, so the schema (db/schema/sensing.ts) and its snapshot stay as
-- they are and every other (zone_id, at) lookup keeps working. Hand-written: drizzle's index
-- builder has no INCLUDE.
DROP INDEX IF EXISTS "readings_zone_id_at_index";--> statement-breakpoint
CREATE INDEX "readings_zone_id_at_index" ON "readings" USING btree ("zone_id", "at")
  INCLUDE ("air_c", "rh_pct", "surface_c", "dew_point_c", "margin_k", "emc_pct", "level");
