CREATE TABLE "device_cursors" (
	"device_id" uuid PRIMARY KEY NOT NULL,
	"last_seq" integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE "op_receipts" (
	"op_id" uuid PRIMARY KEY NOT NULL,
	"device_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"user_id" text NOT NULL,
	"status" text NOT NULL,
	"reason" text NOT NULL,
	"conflict_ids" uuid[] NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_conflicts" (
	"id" uuid PRIMARY KEY NOT NULL,
	"competition_id" uuid NOT NULL,
	"area" "area" NOT NULL,
	"kind" text NOT NULL,
	"record_id" uuid NOT NULL,
	"field" text,
	"base" jsonb,
	"kept" jsonb NOT NULL,
	"incoming" jsonb NOT NULL,
	"status" text NOT NULL,
	"settlement" jsonb,
	"change_seq" bigint NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_counter" (
	"id" integer PRIMARY KEY NOT NULL,
	"value" bigint NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_records" (
	"id" uuid PRIMARY KEY NOT NULL,
	"kind" text NOT NULL,
	"competition_id" uuid NOT NULL,
	"area" "area" NOT NULL,
	"fields" jsonb NOT NULL,
	"field_sources" jsonb NOT NULL,
	"created_by" text NOT NULL,
	"device_id" uuid NOT NULL,
	"hlc" text NOT NULL,
	"natural_key" text,
	"deleted" boolean DEFAULT false NOT NULL,
	"version" integer NOT NULL,
	"change_seq" bigint NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sync_conflicts" ADD CONSTRAINT "sync_conflicts_competition_id_competitions_id_fk" FOREIGN KEY ("competition_id") REFERENCES "public"."competitions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_records" ADD CONSTRAINT "sync_records_competition_id_competitions_id_fk" FOREIGN KEY ("competition_id") REFERENCES "public"."competitions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "sync_conflicts_change_idx" ON "sync_conflicts" USING btree ("change_seq");--> statement-breakpoint
CREATE INDEX "sync_conflicts_record_idx" ON "sync_conflicts" USING btree ("record_id");--> statement-breakpoint
CREATE INDEX "sync_records_change_idx" ON "sync_records" USING btree ("change_seq");--> statement-breakpoint
CREATE INDEX "sync_records_natural_key_idx" ON "sync_records" USING btree ("natural_key");--> statement-breakpoint
CREATE INDEX "sync_records_competition_idx" ON "sync_records" USING btree ("competition_id");--> statement-breakpoint
INSERT INTO "sync_counter" ("id", "value") VALUES (1, 0);
