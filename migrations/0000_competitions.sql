CREATE TYPE "public"."competition_level" AS ENUM('international', 'national', 'junior', 'youth');--> statement-breakpoint
CREATE TYPE "public"."competition_status" AS ENUM('planned', 'open', 'closed');--> statement-breakpoint
CREATE TYPE "public"."track_type" AS ENUM('natural', 'artificial');--> statement-breakpoint
CREATE TABLE "competitions" (
	"id" uuid PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"track_type" "track_type" NOT NULL,
	"level" "competition_level" NOT NULL,
	"venue" text NOT NULL,
	"first_run_on" date NOT NULL,
	"status" "competition_status" DEFAULT 'planned' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
