CREATE TABLE "apparatus_changes" (
	"id" serial PRIMARY KEY NOT NULL,
	"apparatus_id" integer NOT NULL,
	"description" text NOT NULL,
	"changed_on" date NOT NULL,
	"recorded_by" integer NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "standardizations" (
	"id" serial PRIMARY KEY NOT NULL,
	"apparatus_id" integer NOT NULL,
	"energy_equivalent" double precision NOT NULL,
	"energy_equivalent_u" double precision NOT NULL,
	"heat_loss_coefficient" double precision,
	"heat_loss_coefficient_u" double precision,
	"run_ids" integer[] NOT NULL,
	"summary" jsonb NOT NULL,
	"effective_from" date NOT NULL,
	"signer_id" integer NOT NULL,
	"meaning" text NOT NULL,
	"reason" text,
	"signed_hash" text NOT NULL,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "apparatus_changes" ADD CONSTRAINT "apparatus_changes_apparatus_id_apparatus_id_fk" FOREIGN KEY ("apparatus_id") REFERENCES "public"."apparatus"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "apparatus_changes" ADD CONSTRAINT "apparatus_changes_recorded_by_people_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standardizations" ADD CONSTRAINT "standardizations_apparatus_id_apparatus_id_fk" FOREIGN KEY ("apparatus_id") REFERENCES "public"."apparatus"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standardizations" ADD CONSTRAINT "standardizations_signer_id_people_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "apparatus_changes_apparatus_idx" ON "apparatus_changes" USING btree ("apparatus_id","recorded_at");--> statement-breakpoint
CREATE INDEX "standardizations_apparatus_idx" ON "standardizations" USING btree ("apparatus_id","effective_from");