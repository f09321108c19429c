CREATE TABLE "defect_code" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"description" text,
	"active" boolean DEFAULT true NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "defect_code_code_uq" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "disposition" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"ncr_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"kind" text NOT NULL,
	"quantity" integer NOT NULL,
	"rationale" text NOT NULL,
	"concession_ref" text,
	"hours" double precision,
	"rate" double precision,
	"scrap_value" double precision,
	"freight" double precision,
	"cost" double precision NOT NULL,
	"signature_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "disposition_ncr_seq_uq" UNIQUE("ncr_id","seq"),
	CONSTRAINT "disposition_quantity_chk" CHECK ("disposition"."quantity" >= 1),
	CONSTRAINT "disposition_concession_chk" CHECK ("disposition"."kind" <> 'use-as-is' or "disposition"."concession_ref" is not null)
);
--> statement-breakpoint
CREATE TABLE "document_counter" (
	"kind" text NOT NULL,
	"year" integer NOT NULL,
	"last" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "document_counter_pkey" PRIMARY KEY("kind","year")
);
--> statement-breakpoint
CREATE TABLE "e_signature" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"entity" text NOT NULL,
	"entity_id" uuid NOT NULL,
	"purpose" text NOT NULL,
	"signer_id" uuid NOT NULL,
	"signer_name" text NOT NULL,
	"signer_email" text NOT NULL,
	"signer_role" text NOT NULL,
	"meaning" text NOT NULL,
	"signed_at" timestamp with time zone NOT NULL,
	"content" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	CONSTRAINT "e_signature_hash_chk" CHECK ("e_signature"."content_hash" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "ncr" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"year" integer NOT NULL,
	"seq" integer NOT NULL,
	"source" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"title" text NOT NULL,
	"requirement" text NOT NULL,
	"found" text NOT NULL,
	"defect_codes" text[] DEFAULT '{}' NOT NULL,
	"suspect_quantity" integer NOT NULL,
	"lot_id" uuid,
	"supplier_id" uuid,
	"part_id" uuid,
	"characteristic_code" text,
	"signal_id" uuid,
	"sample_ids" uuid[] DEFAULT '{}' NOT NULL,
	"reading_ids" uuid[] DEFAULT '{}' NOT NULL,
	"raised_by" uuid,
	"raised_at" timestamp with time zone DEFAULT now() NOT NULL,
	"review_started_at" timestamp with time zone,
	"dispositioned_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"closed_by" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "ncr_number_uq" UNIQUE("number"),
	CONSTRAINT "ncr_year_seq_uq" UNIQUE("year","seq"),
	CONSTRAINT "ncr_suspect_quantity_chk" CHECK ("ncr"."suspect_quantity" >= 1)
);
--> statement-breakpoint
CREATE TABLE "ncr_photo" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"ncr_id" uuid NOT NULL,
	"photo_id" uuid,
	"caption" text,
	"web_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" bigint NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "ncr_photo_ncr_photo_uq" UNIQUE("ncr_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "corrective_action" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"year" integer NOT NULL,
	"seq" integer NOT NULL,
	"ncr_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid,
	"title" text NOT NULL,
	"problem" text NOT NULL,
	"defect_codes" text[] DEFAULT '{}' NOT NULL,
	"recipients" text[] DEFAULT '{}' NOT NULL,
	"status" text DEFAULT 'issued' NOT NULL,
	"issued_by" uuid,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"acknowledged_at" timestamp with time zone,
	"accepted_at" timestamp with time zone,
	"verifying_since" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"closed_by" uuid,
	"verify_lots_required" integer DEFAULT 3 NOT NULL,
	"verify_lots" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"recurrence_lot_id" uuid,
	"recurrence_ncr_id" uuid,
	"recurrence_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "corrective_action_number_uq" UNIQUE("number"),
	CONSTRAINT "corrective_action_year_seq_uq" UNIQUE("year","seq")
);
--> statement-breakpoint
CREATE TABLE "corrective_action_evidence" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"corrective_action_id" uuid NOT NULL,
	"step" text NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"content_type" text NOT NULL,
	"bytes" bigint NOT NULL,
	"caption" text,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "corrective_action_step" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"corrective_action_id" uuid NOT NULL,
	"step" text NOT NULL,
	"status" text DEFAULT 'locked' NOT NULL,
	"answer" jsonb,
	"draft" jsonb,
	"draft_saved_at" timestamp with time zone,
	"submitted_at" timestamp with time zone,
	"submitted_by" uuid,
	"reviewed_at" timestamp with time zone,
	"reviewed_by" uuid,
	"review_decision" text,
	"review_comment" text,
	"due_on" date,
	"reminder_sent_for" date,
	"overdue_sent_for" date,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "corrective_action_step_uq" UNIQUE("corrective_action_id","step")
);
--> statement-breakpoint
CREATE TABLE "supplier_notice" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"title" text NOT NULL,
	"body" text NOT NULL,
	"part_id" uuid,
	"characteristic_code" text,
	"lots_remaining" double precision,
	"signal_id" uuid,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "outbox_message" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" text NOT NULL,
	"to" text[] NOT NULL,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"html" text,
	"entity" text,
	"entity_id" uuid,
	"dedupe_key" text,
	"message_id" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_error" text,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "outbox_message_dedupe_uq" UNIQUE("dedupe_key")
);
--> statement-breakpoint
ALTER TABLE "disposition" ADD CONSTRAINT "disposition_ncr_id_ncr_id_fk" FOREIGN KEY ("ncr_id") REFERENCES "public"."ncr"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "disposition" ADD CONSTRAINT "disposition_signature_id_e_signature_id_fk" FOREIGN KEY ("signature_id") REFERENCES "public"."e_signature"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "e_signature" ADD CONSTRAINT "e_signature_signer_id_app_user_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."app_user"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr" ADD CONSTRAINT "ncr_lot_id_lot_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lot"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr" ADD CONSTRAINT "ncr_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr" ADD CONSTRAINT "ncr_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr" ADD CONSTRAINT "ncr_raised_by_app_user_id_fk" FOREIGN KEY ("raised_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr" ADD CONSTRAINT "ncr_closed_by_app_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr_photo" ADD CONSTRAINT "ncr_photo_ncr_id_ncr_id_fk" FOREIGN KEY ("ncr_id") REFERENCES "public"."ncr"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr_photo" ADD CONSTRAINT "ncr_photo_photo_id_photo_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photo"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ncr_photo" ADD CONSTRAINT "ncr_photo_uploaded_by_app_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_ncr_id_ncr_id_fk" FOREIGN KEY ("ncr_id") REFERENCES "public"."ncr"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_issued_by_app_user_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_closed_by_app_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action_evidence" ADD CONSTRAINT "corrective_action_evidence_corrective_action_id_corrective_action_id_fk" FOREIGN KEY ("corrective_action_id") REFERENCES "public"."corrective_action"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action_evidence" ADD CONSTRAINT "corrective_action_evidence_uploaded_by_app_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action_step" ADD CONSTRAINT "corrective_action_step_corrective_action_id_corrective_action_id_fk" FOREIGN KEY ("corrective_action_id") REFERENCES "public"."corrective_action"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action_step" ADD CONSTRAINT "corrective_action_step_submitted_by_app_user_id_fk" FOREIGN KEY ("submitted_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action_step" ADD CONSTRAINT "corrective_action_step_reviewed_by_app_user_id_fk" FOREIGN KEY ("reviewed_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_notice" ADD CONSTRAINT "supplier_notice_supplier_id_supplier_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."supplier"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_notice" ADD CONSTRAINT "supplier_notice_part_id_part_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."part"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_notice" ADD CONSTRAINT "supplier_notice_created_by_app_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."app_user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "e_signature_entity_idx" ON "e_signature" USING btree ("entity","entity_id");--> statement-breakpoint
CREATE UNIQUE INDEX "e_signature_one_disposition_uq" ON "e_signature" USING btree ("entity_id","purpose") WHERE "e_signature"."entity" = 'ncr';--> statement-breakpoint
CREATE INDEX "ncr_status_raised_idx" ON "ncr" USING btree ("status","raised_at");--> statement-breakpoint
CREATE INDEX "ncr_supplier_idx" ON "ncr" USING btree ("supplier_id","raised_at");--> statement-breakpoint
CREATE INDEX "ncr_lot_idx" ON "ncr" USING btree ("lot_id");--> statement-breakpoint
CREATE INDEX "ncr_photo_ncr_idx" ON "ncr_photo" USING btree ("ncr_id");--> statement-breakpoint
CREATE INDEX "corrective_action_supplier_idx" ON "corrective_action" USING btree ("supplier_id","status");--> statement-breakpoint
CREATE INDEX "corrective_action_ncr_idx" ON "corrective_action" USING btree ("ncr_id");--> statement-breakpoint
CREATE UNIQUE INDEX "corrective_action_one_open_per_ncr_uq" ON "corrective_action" USING btree ("ncr_id") WHERE "corrective_action"."status" <> 'closed';--> statement-breakpoint
CREATE INDEX "corrective_action_evidence_ca_idx" ON "corrective_action_evidence" USING btree ("corrective_action_id","step");--> statement-breakpoint
CREATE INDEX "corrective_action_step_due_idx" ON "corrective_action_step" USING btree ("due_on");--> statement-breakpoint
CREATE INDEX "supplier_notice_supplier_idx" ON "supplier_notice" USING btree ("supplier_id","created_at");--> statement-breakpoint
CREATE INDEX "outbox_message_due_idx" ON "outbox_message" USING btree ("status","next_attempt_at");--> statement-breakpoint
CREATE INDEX "outbox_message_entity_idx" ON "outbox_message" USING btree ("entity_id");