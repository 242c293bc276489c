CREATE TYPE "public"."import_status" AS ENUM('uploaded', 'queued', 'running', 'done', 'failed', 'cancelled');--> statement-breakpoint
CREATE TABLE "import_rejects" (
	"import_id" uuid NOT NULL,
	"line" integer NOT NULL,
	"reason" text NOT NULL,
	"row" text NOT NULL,
	CONSTRAINT "import_rejects_import_id_line_pk" PRIMARY KEY("import_id","line")
);
--> statement-breakpoint
CREATE TABLE "imports" (
	"id" uuid PRIMARY KEY NOT NULL,
	"shop_id" uuid NOT NULL,
	"sensor_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"bytes" integer NOT NULL,
	"object_key" text NOT NULL,
	"delimiter" text NOT NULL,
	"columns" jsonb NOT NULL,
	"sample_rows" jsonb NOT NULL,
	"mapping" jsonb,
	"status" "import_status" DEFAULT 'uploaded' NOT NULL,
	"rows_read" integer DEFAULT 0 NOT NULL,
	"rows_stored" integer DEFAULT 0 NOT NULL,
	"rows_duplicate" integer DEFAULT 0 NOT NULL,
	"rows_rejected" integer DEFAULT 0 NOT NULL,
	"first_at" timestamp with time zone,
	"last_at" timestamp with time zone,
	"error_code" text,
	"error_message" text,
	"cancel_requested_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "sensor_import_mappings" (
	"sensor_id" uuid PRIMARY KEY NOT NULL,
	"mapping" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "import_rejects" ADD CONSTRAINT "import_rejects_import_id_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."imports"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_sensor_id_sensors_id_fk" FOREIGN KEY ("sensor_id") REFERENCES "public"."sensors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sensor_import_mappings" ADD CONSTRAINT "sensor_import_mappings_sensor_id_sensors_id_fk" FOREIGN KEY ("sensor_id") REFERENCES "public"."sensors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "imports_sensor_created_idx" ON "imports" USING btree ("sensor_id","created_at");