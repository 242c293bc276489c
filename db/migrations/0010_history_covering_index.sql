-- The zone history's query (db/queries/readings.ts querySeries) reads a zone's week: 20,000
-- readings from two sensors posting each minute. Through the plain (zone_id, at) index each one
-- is a heap fetch from a different page (readings arrive interleaved from every sensor): about
-- 20,000 pages and a p95 of 76-83 ms at 10 M rows on the bench machine, warm; with the chart's
-- columns in the index it is an index-only scan, about 1,000 buffer touches and 9-10 ms p95
-- (npm run bench, chartQueryP95Ms). Inserts pay for the wider index: about 12-16 % more
-- PostgreSQL time per row in an isolated A/B; the ingest phases' figures moved within noise.
-- sensor_id is included too: the week report (db/queries/reports.ts) orders a zone's readings
-- by (at, sensor_id), and with it the report's scan is index-only as well (about 120 -> 79 ms of
-- database time for a 10-zone week of 1-minute readings, measured on a test database).
-- Same name and key as before, so the schema (db/schema/sensing.ts) and its snapshot stay as
-- they are and every other (zone_id, at) lookup keeps working. Hand-written: drizzle's index
-- builder has no INCLUDE.
DROP INDEX IF EXISTS "readings_zone_id_at_index";--> statement-breakpoint
CREATE INDEX "readings_zone_id_at_index" ON "readings" USING btree ("zone_id", "at")
  INCLUDE ("sensor_id", "air_c", "rh_pct", "surface_c", "dew_point_c", "margin_k", "emc_pct", "level");
