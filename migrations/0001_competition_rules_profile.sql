ALTER TABLE "competitions" ADD COLUMN "rules_profile" jsonb;--> statement-breakpoint
ALTER TABLE "competitions" ADD COLUMN "rules_profile_frozen_at" timestamp with time zone;