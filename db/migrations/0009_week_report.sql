CREATE TYPE "public"."paper_size" AS ENUM('a4', 'letter');--> statement-breakpoint
CREATE TABLE "week_report_mails" (
	"shop_id" uuid NOT NULL,
	"week_start" date NOT NULL,
	"sent_at" timestamp with time zone,
	"recipients" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "week_report_mails_shop_id_week_start_pk" PRIMARY KEY("shop_id","week_start")
);
--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "paper_size" "paper_size" DEFAULT 'a4' NOT NULL;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "week_report_mail" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "week_report_mails" ADD CONSTRAINT "week_report_mails_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;