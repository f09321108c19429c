ALTER TABLE "audit_event" ADD COLUMN "prev_hash" text;--> statement-breakpoint
ALTER TABLE "audit_event" ADD COLUMN "hash" text NOT NULL DEFAULT 'before-chain';--> statement-breakpoint
ALTER TABLE "audit_event" ALTER COLUMN "hash" DROP DEFAULT;--> statement-breakpoint
CREATE FUNCTION audit_event_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'audit_event is append-only: % is not allowed', TG_OP USING ERRCODE = '42501';
END;
$$;--> statement-breakpoint
CREATE TRIGGER audit_event_no_update_delete BEFORE UPDATE OR DELETE ON "audit_event" FOR EACH ROW EXECUTE FUNCTION audit_event_append_only();--> statement-breakpoint
CREATE TRIGGER audit_event_no_truncate BEFORE TRUNCATE ON "audit_event" FOR EACH STATEMENT EXECUTE FUNCTION audit_event_append_only();
