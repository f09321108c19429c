CREATE TABLE "lot" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"ref" serial NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"plan_id" uuid NOT NULL,
	"supplier_lot_number" text NOT NULL,
	"po_number" text,
	"quantity" integer NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"heat_numbers" text[] DEFAULT '{}' NOT NULL,
	"packaging_condition" text DEFAULT 'good' NOT NULL,
	"packaging_note" text,
	"certificate_key" text,
	"certificate_name" text,
	"certificate_type" text,
	"status" text DEFAULT 'received' NOT NULL,
	"sampling" jsonb NOT NULL,
	"decision" text,
	"decision_comment" text,
	"nonconforming_count" integer,
	"decided_by" uuid,
	"decided_at" timestamp with time zone,
	"received_by" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lot_ref_uq" UNIQUE("ref"),
	CONSTRAINT "lot_quantity_chk" CHECK ("lot"."quantity" >= 1)
);
--> statement-breakpoint
CREATE TABLE "lot_sample" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"serial" integer NOT NULL,
	CONSTRAINT "lot_sample_lot_serial_uq" UNIQUE("lot_id","serial")
);
--> statement-breakpoint
CREATE TABLE "photo" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"sample_id" uuid,
	"characteristic_code" text,
	"caption" text,
	"web_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" bigint NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reading" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"sample_id" uuid NOT NULL,
	"characteristic_code" text NOT NULL,
	"values" double precision[] DEFAULT '{}' NOT NULL,
	"value" double precision,
	"pass" boolean,
	"conforming" boolean,
	"note" text,
	"gauge_id" uuid,
	"gauge_due_on" date,
	"entered_by" uuid,
	"entered_at" timestamp with time zone DEFAULT now() NOT NULL,
	"source" text DEFAULT 'bench' NOT NULL,
	CONSTRAINT "reading_sample_characteristic_uq" UNIQUE("sample_id","characteristic_code")
);
--> statement-breakpoint
CREATE TABLE "reading_import" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"file_name" text NOT NULL,
	"row_count" integer NOT NULL,
	"reading_count" integer NOT NULL,
	"imported_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reading_import_lot_sha_uq" UNIQUE("lot_id","sha256")
);
--> statement-breakpoint
CREATE TABLE "switching_event" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"lot_id" uuid,
	"event" text,
	"reason" text NOT NULL,
	"before" jsonb NOT NULL,
	"after" jsonb NOT NULL,
	"actor_id" uuid,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "switching_state" (
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"state" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "switching_state_pkey" PRIMARY KEY("supplier_id","part_id")
);
--> statement-breakpoint
ALTER TABLE "lot" ADD CONSTRAINT "lot_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot" ADD CONSTRAINT "lot_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot" ADD CONSTRAINT "lot_plan_id_inspection_plan_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."inspection_plan"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot" ADD CONSTRAINT "lot_decided_by_app_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot" ADD CONSTRAINT "lot_received_by_app_user_id_fk" FOREIGN KEY ("received_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lot_sample" ADD CONSTRAINT "lot_sample_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo" ADD CONSTRAINT "photo_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo" ADD CONSTRAINT "photo_sample_id_lot_sample_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."lot_sample"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo" ADD CONSTRAINT "photo_uploaded_by_app_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading" ADD CONSTRAINT "reading_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading" ADD CONSTRAINT "reading_sample_id_lot_sample_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."lot_sample"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading" ADD CONSTRAINT "reading_gauge_id_gauge_id_fk" FOREIGN KEY ("gauge_id") REFERENCES "public"."gauge"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading" ADD CONSTRAINT "reading_entered_by_app_user_id_fk" FOREIGN KEY ("entered_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_import" ADD CONSTRAINT "reading_import_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_import" ADD CONSTRAINT "reading_import_imported_by_app_user_id_fk" FOREIGN KEY ("imported_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_event" ADD CONSTRAINT "switching_event_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_event" ADD CONSTRAINT "switching_event_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_event" ADD CONSTRAINT "switching_event_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_event" ADD CONSTRAINT "switching_event_actor_id_app_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_state" ADD CONSTRAINT "switching_state_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "switching_state" ADD CONSTRAINT "switching_state_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "lot_status_received_idx" ON "lot" USING btree ("status","received_at");--> statement-breakpoint
CREATE INDEX "lot_supplier_part_idx" ON "lot" USING btree ("supplier_id","part_id","received_at");--> statement-breakpoint
CREATE INDEX "photo_lot_idx" ON "photo" USING btree ("lot_id");--> statement-breakpoint
CREATE INDEX "reading_lot_idx" ON "reading" USING btree ("lot_id");--> statement-breakpoint
CREATE INDEX "switching_event_sp_idx" ON "switching_event" USING btree ("supplier_id","part_id","at");