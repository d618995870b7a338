CREATE TABLE "instruments" (
	"id" uuid PRIMARY KEY NOT NULL,
	"competition_id" uuid NOT NULL,
	"label" text NOT NULL,
	"purpose" text NOT NULL,
	"calibrated_until" date NOT NULL,
	"assigned_to" text,
	"certificate_sha256" text,
	CONSTRAINT "instruments_label_unique" UNIQUE("competition_id","label"),
	CONSTRAINT "instruments_purpose_check" CHECK ("instruments"."purpose" in ('control-steel-pyrometer', 'sled-pyrometer', 'scale', 'control-weight', 'gap-probe', 'caliper', 'steel-rule', 'angle-gauge')),
	CONSTRAINT "instruments_certificate_check" CHECK ("instruments"."certificate_sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "start_list_entries" (
	"competition_id" uuid NOT NULL,
	"bib" integer NOT NULL,
	"start_order" integer NOT NULL,
	"discipline" text NOT NULL,
	"athlete" text NOT NULL,
	"second_athlete" text,
	CONSTRAINT "start_list_entries_bib_pk" PRIMARY KEY("competition_id","bib"),
	CONSTRAINT "start_list_entries_start_order_unique" UNIQUE("competition_id","start_order"),
	CONSTRAINT "start_list_entries_discipline_check" CHECK ("start_list_entries"."discipline" in ('singles-women', 'singles-men', 'doubles')),
	CONSTRAINT "start_list_entries_positive_check" CHECK ("start_list_entries"."bib" > 0 and "start_list_entries"."start_order" > 0),
	CONSTRAINT "start_list_entries_doubles_check" CHECK (("start_list_entries"."discipline" = 'doubles') = ("start_list_entries"."second_athlete" is not null))
);
--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_competition_id_competitions_id_fk" FOREIGN KEY ("competition_id") REFERENCES "public"."competitions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_assigned_to_users_id_fk" FOREIGN KEY ("assigned_to") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "start_list_entries" ADD CONSTRAINT "start_list_entries_competition_id_competitions_id_fk" FOREIGN KEY ("competition_id") REFERENCES "public"."competitions"("id") ON DELETE cascade ON UPDATE no action;