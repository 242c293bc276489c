CREATE TYPE "public"."emc_region" AS ENUM('most', 'dry_southwest', 'damp_coastal');--> statement-breakpoint
CREATE TYPE "public"."zone_purpose" AS ENUM('machines', 'lumber', 'finishing', 'general');--> statement-breakpoint
ALTER TABLE "zones" ADD COLUMN "purpose" "zone_purpose" DEFAULT 'machines' NOT NULL;--> statement-breakpoint
ALTER TABLE "zones" ADD COLUMN "emc_region" "emc_region" DEFAULT 'most' NOT NULL;