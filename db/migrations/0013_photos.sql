CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"shop_id" uuid NOT NULL,
	"owner_kind" text,
	"owner_id" uuid,
	"object_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"width_px" integer NOT NULL,
	"height_px" integer NOT NULL,
	"thumb_width_px" integer NOT NULL,
	"thumb_height_px" integer NOT NULL,
	"bytes" integer NOT NULL,
	"thumb_bytes" integer NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "photos_shop_owner_idx" ON "photos" USING btree ("shop_id","owner_kind","owner_id");