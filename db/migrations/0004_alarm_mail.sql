CREATE TYPE "public"."alarm_mail_outcome" AS ENUM('sending', 'sent', 'capped', 'covered', 'stale', 'cleared', 'nobody');--> statement-breakpoint
CREATE TABLE "alarm_mails" (
	"alarm_id" uuid PRIMARY KEY NOT NULL,
	"shop_id" uuid NOT NULL,
	"zone_id" uuid NOT NULL,
	"kind" "alarm_kind" NOT NULL,
	"opened_at" timestamp with time zone NOT NULL,
	"outcome" "alarm_mail_outcome" NOT NULL,
	"sent_to" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	"decided_at" timestamp with time zone NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "alarm_mail" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "alarm_mails" ADD CONSTRAINT "alarm_mails_alarm_id_alarms_id_fk" FOREIGN KEY ("alarm_id") REFERENCES "public"."alarms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "alarm_mails_zone_id_kind_opened_at_index" ON "alarm_mails" USING btree ("zone_id","kind","opened_at");