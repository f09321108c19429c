-- Rate-limit counters shared by every API process (sign-in per client address, uploads per user).
-- One fixed window per key. Unlogged: counters need no crash safety and should cost no WAL.
CREATE UNLOGGED TABLE IF NOT EXISTS "rate_limit" (
	"key" text PRIMARY KEY NOT NULL,
	"hits" integer NOT NULL,
	"expires_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "rate_limit_expires_idx" ON "rate_limit" ("expires_at");
