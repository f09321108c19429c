CREATE TABLE "control_limit" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"characteristic_code" text NOT NULL,
	"version" integer NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"chart_kind" text NOT NULL,
	"subgroup_size" integer,
	"rule_set" text NOT NULL,
	"center" double precision NOT NULL,
	"ucl" double precision,
	"lcl" double precision,
	"sigma" double precision NOT NULL,
	"range_center" double precision,
	"range_ucl" double precision,
	"range_lcl" double precision,
	"baseline" jsonb NOT NULL,
	"baseline_subgroups" integer NOT NULL,
	"excluded" integer[] DEFAULT '{}' NOT NULL,
	"excluded_points" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"iterations" integer DEFAULT 1 NOT NULL,
	"service_lots" integer DEFAULT 5 NOT NULL,
	"reason" text NOT NULL,
	"frozen_by" uuid,
	"frozen_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "control_limit_version_uq" UNIQUE("supplier_id","part_id","characteristic_code","version"),
	CONSTRAINT "control_limit_version_chk" CHECK ("control_limit"."version" >= 1)
);
--> statement-breakpoint
CREATE TABLE "die_wear_forecast" (
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"characteristic_code" text NOT NULL,
	"last_lot_id" uuid,
	"lots_used" integer NOT NULL,
	"slope" double precision NOT NULL,
	"intercept" double precision NOT NULL,
	"usl" double precision NOT NULL,
	"lots_to_limit" double precision,
	"lots_to_limit_lower" double precision,
	"service_lots" integer NOT NULL,
	"service_due" boolean NOT NULL,
	"due_since" timestamp with time zone,
	"notified_at" timestamp with time zone,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "die_wear_forecast_pkey" PRIMARY KEY("supplier_id","part_id","characteristic_code")
);
--> statement-breakpoint
CREATE TABLE "drift_signal" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"characteristic_code" text NOT NULL,
	"rule" text NOT NULL,
	"chart" text NOT NULL,
	"lot_id" uuid NOT NULL,
	"lot_ref" integer NOT NULL,
	"sample_id" uuid,
	"serial" integer,
	"value" double precision NOT NULL,
	"center" double precision,
	"ucl" double precision,
	"lcl" double precision,
	"limit_version" integer,
	"message" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"ack_note" text,
	"ack_by" uuid,
	"ack_at" timestamp with time zone,
	"ncr_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "drift_signal_once_uq" UNIQUE("supplier_id","part_id","characteristic_code","chart","rule","lot_id")
);
--> statement-breakpoint
ALTER TABLE "control_limit" ADD CONSTRAINT "control_limit_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "control_limit" ADD CONSTRAINT "control_limit_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "control_limit" ADD CONSTRAINT "control_limit_frozen_by_app_user_id_fk" FOREIGN KEY ("frozen_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "die_wear_forecast" ADD CONSTRAINT "die_wear_forecast_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "die_wear_forecast" ADD CONSTRAINT "die_wear_forecast_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "die_wear_forecast" ADD CONSTRAINT "die_wear_forecast_last_lot_id_lot_id_fk" FOREIGN KEY ("last_lot_id") REFERENCES "public"."lot"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_signal" ADD CONSTRAINT "drift_signal_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_signal" ADD CONSTRAINT "drift_signal_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_signal" ADD CONSTRAINT "drift_signal_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_signal" ADD CONSTRAINT "drift_signal_sample_id_lot_sample_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."lot_sample"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_signal" ADD CONSTRAINT "drift_signal_ack_by_app_user_id_fk" FOREIGN KEY ("ack_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "control_limit_one_active_uq" ON "control_limit" USING btree ("supplier_id","part_id","characteristic_code") WHERE "control_limit"."active";--> statement-breakpoint
CREATE INDEX "die_wear_forecast_due_idx" ON "die_wear_forecast" USING btree ("service_due");--> statement-breakpoint
CREATE INDEX "drift_signal_status_idx" ON "drift_signal" USING btree ("supplier_id","part_id","characteristic_code","status");--> statement-breakpoint
CREATE INDEX "drift_signal_open_idx" ON "drift_signal" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "reading_lot_code_idx" ON "reading" USING btree ("lot_id","characteristic_code");