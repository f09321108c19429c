CREATE TABLE "part" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_number" text NOT NULL,
	"revision" text NOT NULL,
	"description" text NOT NULL,
	"construction" text NOT NULL,
	"steel_grade" text NOT NULL,
	"loss_w_per_kg" double precision NOT NULL,
	"grade_thickness_mm" double precision NOT NULL,
	"lamination_thickness_mm" double precision NOT NULL,
	"lamination_area_cm2" double precision NOT NULL,
	"density_gcm3" double precision NOT NULL,
	"density_source" text NOT NULL,
	"nominal_bore_mm" double precision NOT NULL,
	"nominal_od_mm" double precision NOT NULL,
	"nominal_stack_length_mm" double precision NOT NULL,
	"slot_count" integer NOT NULL,
	"nominal_mass_kg" double precision NOT NULL,
	"design_stacking_factor" double precision,
	"design_tooth_t" double precision,
	"design_yoke_t" double precision,
	"drawing_key" text,
	"drawing_name" text,
	"drawing_size" bigint,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "part_number_revision_uq" UNIQUE("part_number","revision")
);
--> statement-breakpoint
CREATE TABLE "gauge" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"asset_tag" text NOT NULL,
	"kind" text NOT NULL,
	"description" text NOT NULL,
	"resolution" double precision NOT NULL,
	"unit" text NOT NULL,
	"range_min" double precision,
	"range_max" double precision,
	"calibration_due_on" date NOT NULL,
	"status" text DEFAULT 'in-service' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "gauge_asset_tag_uq" UNIQUE("asset_tag")
);
--> statement-breakpoint
CREATE TABLE "inspection_plan" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"sampling_kind" text NOT NULL,
	"inspection_level" text,
	"aql" double precision,
	"zero_sample_size" integer,
	"notes" text,
	"based_on_plan_id" uuid,
	"created_by" uuid,
	"activated_by" uuid,
	"activated_at" timestamp with time zone,
	"superseded_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "inspection_plan_part_revision_uq" UNIQUE("part_id","revision")
);
--> statement-breakpoint
CREATE TABLE "plan_characteristic" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"plan_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"unit" text,
	"nominal" double precision,
	"lsl" double precision,
	"usl" double precision,
	"method" text,
	"gauge_kind" text,
	"layout" text NOT NULL,
	"angles" integer,
	"levels" integer,
	"readings_per_sample" integer DEFAULT 1 NOT NULL,
	"derived_formula" text,
	"inputs" jsonb,
	"chart_kind" text DEFAULT 'none' NOT NULL,
	"subgroup_size" integer,
	"severity" text DEFAULT 'major' NOT NULL,
	"wear_driven" boolean DEFAULT false NOT NULL,
	"rule_set" text DEFAULT 'western-electric' NOT NULL,
	CONSTRAINT "plan_characteristic_plan_code_uq" UNIQUE("plan_id","code"),
	CONSTRAINT "plan_characteristic_limits_chk" CHECK ("plan_characteristic"."lsl" is null or "plan_characteristic"."usl" is null or "plan_characteristic"."lsl" < "plan_characteristic"."usl")
);
--> statement-breakpoint
ALTER TABLE "supplier" ADD COLUMN "contact_emails" text[] DEFAULT '{}' NOT NULL;--> statement-breakpoint
ALTER TABLE "supplier" ADD COLUMN "approval_status" text DEFAULT 'approved' NOT NULL;--> statement-breakpoint
ALTER TABLE "supplier" ADD COLUMN "approval_reason" text;--> statement-breakpoint
ALTER TABLE "supplier" ADD COLUMN "notes" text;--> statement-breakpoint
ALTER TABLE "supplier" ADD COLUMN "version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "inspection_plan" ADD CONSTRAINT "inspection_plan_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_plan" ADD CONSTRAINT "inspection_plan_created_by_app_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_plan" ADD CONSTRAINT "inspection_plan_activated_by_app_user_id_fk" FOREIGN KEY ("activated_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_characteristic" ADD CONSTRAINT "plan_characteristic_plan_id_inspection_plan_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."inspection_plan"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "inspection_plan_one_active_uq" ON "inspection_plan" USING btree ("part_id") WHERE "inspection_plan"."status" = 'active';--> statement-breakpoint
CREATE INDEX "plan_characteristic_plan_idx" ON "plan_characteristic" USING btree ("plan_id");