CREATE TYPE "public"."role" AS ENUM('technician', 'assistant', 'investigator', 'quality', 'admin');--> statement-breakpoint
CREATE TYPE "public"."channel_kind" AS ENUM('pressure', 'volume', 'displacement', 'temperature', 'voltage', 'current', 'power', 'time');--> statement-breakpoint
CREATE TYPE "public"."process" AS ENUM('isobaric', 'isochoric', 'isothermal', 'adiabatic', 'polytropic', 'calorimetric');--> statement-breakpoint
CREATE TYPE "public"."run_state" AS ENUM('draft', 'submitted', 'approved', 'returned', 'rejected');--> statement-breakpoint
CREATE TYPE "public"."verdict" AS ENUM('closes', 'breaks', 'indeterminate');--> statement-breakpoint
CREATE TABLE "people" (
	"id" serial PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"role" "role" NOT NULL,
	"password_hash" text NOT NULL,
	"failed_attempts" integer DEFAULT 0 NOT NULL,
	"locked_until" timestamp with time zone,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "people_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "project_members" (
	"project_id" integer NOT NULL,
	"person_id" integer NOT NULL,
	CONSTRAINT "project_members_project_id_person_id_pk" PRIMARY KEY("project_id","person_id")
);
--> statement-breakpoint
CREATE TABLE "projects" (
	"id" serial PRIMARY KEY NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "projects_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "apparatus" (
	"id" serial PRIMARY KEY NOT NULL,
	"tag" text NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"heat_capacity" double precision,
	"heat_capacity_u" double precision,
	"heat_loss_coefficient" double precision,
	"heat_loss_coefficient_u" double precision,
	"rated_pressure" double precision,
	"bore" double precision,
	"fixed_volume" double precision,
	"notes" text DEFAULT '' NOT NULL,
	CONSTRAINT "apparatus_tag_unique" UNIQUE("tag")
);
--> statement-breakpoint
CREATE TABLE "calibrations" (
	"id" serial PRIMARY KEY NOT NULL,
	"instrument_id" integer NOT NULL,
	"calibrated_on" date NOT NULL,
	"due_on" date NOT NULL,
	"certificate" text NOT NULL,
	"expanded_uncertainty" double precision NOT NULL,
	"coverage_factor" double precision DEFAULT 2 NOT NULL,
	"corrections" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "gases" (
	"id" serial PRIMARY KEY NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"molar_mass" double precision NOT NULL,
	"model" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	CONSTRAINT "gases_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "instruments" (
	"id" serial PRIMARY KEY NOT NULL,
	"tag" text NOT NULL,
	"name" text NOT NULL,
	"kind" "channel_kind" NOT NULL,
	"manufacturer" text DEFAULT '' NOT NULL,
	"serial_number" text DEFAULT '' NOT NULL,
	"unit" text NOT NULL,
	"range_min" double precision,
	"range_max" double precision,
	"spec" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "instruments_tag_unique" UNIQUE("tag")
);
--> statement-breakpoint
CREATE TABLE "balance_results" (
	"id" serial PRIMARY KEY NOT NULL,
	"run_id" integer NOT NULL,
	"run_version" integer NOT NULL,
	"engine_version" text NOT NULL,
	"input_hash" text NOT NULL,
	"verdict" "verdict" NOT NULL,
	"en" double precision,
	"residual" double precision NOT NULL,
	"expanded_uncertainty" double precision NOT NULL,
	"result" jsonb NOT NULL,
	"current" boolean DEFAULT true NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mail_outbox" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"recipient" text NOT NULL,
	"subject" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"run_id" integer NOT NULL,
	"seq" integer NOT NULL,
	"time" double precision NOT NULL,
	"pressure" double precision,
	"volume" double precision,
	"displacement" double precision,
	"temperature" double precision,
	"voltage" double precision,
	"current" double precision,
	"power" double precision,
	CONSTRAINT "readings_run_id_seq_pk" PRIMARY KEY("run_id","seq")
);
--> statement-breakpoint
CREATE TABLE "runs" (
	"id" serial PRIMARY KEY NOT NULL,
	"code" text NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"previous_revision_id" integer,
	"revision_reason" text,
	"project_id" integer NOT NULL,
	"author_id" integer NOT NULL,
	"title" text NOT NULL,
	"process" "process" NOT NULL,
	"gas_id" integer,
	"apparatus_id" integer,
	"run_date" date NOT NULL,
	"state" "run_state" DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"setup" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"verdict" "verdict",
	"return_reason" text,
	"submitted_at" timestamp with time zone,
	"decided_at" timestamp with time zone,
	"edited_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "signatures" (
	"id" serial PRIMARY KEY NOT NULL,
	"run_id" integer NOT NULL,
	"signer_id" integer NOT NULL,
	"action" text NOT NULL,
	"meaning" text NOT NULL,
	"reason" text,
	"signed_hash" text NOT NULL,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "uploads" (
	"id" serial PRIMARY KEY NOT NULL,
	"sha256" text NOT NULL,
	"filename" text NOT NULL,
	"media_type" text NOT NULL,
	"size" integer NOT NULL,
	"content" "bytea" NOT NULL,
	"uploaded_by" integer NOT NULL,
	"run_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"occurred_at" timestamp (3) with time zone NOT NULL,
	"actor_id" integer,
	"actor_email" text,
	"action" text NOT NULL,
	"entity_type" text NOT NULL,
	"entity_id" text,
	"before" jsonb,
	"after" jsonb,
	"reason" text,
	"ip" text,
	"prev_hash" text NOT NULL,
	"hash" text NOT NULL,
	CONSTRAINT "audit_events_hash_unique" UNIQUE("hash")
);
--> statement-breakpoint
CREATE TABLE "column_maps" (
	"id" serial PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"owner_id" integer NOT NULL,
	"headers" jsonb NOT NULL,
	"mapping" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "imports" (
	"id" serial PRIMARY KEY NOT NULL,
	"upload_id" integer NOT NULL,
	"status" text DEFAULT 'previewed' NOT NULL,
	"created_by" integer NOT NULL,
	"parsed" jsonb NOT NULL,
	"mapping" jsonb,
	"run_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"committed_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "project_members" ADD CONSTRAINT "project_members_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "project_members" ADD CONSTRAINT "project_members_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "balance_results" ADD CONSTRAINT "balance_results_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_author_id_people_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_gas_id_gases_id_fk" FOREIGN KEY ("gas_id") REFERENCES "public"."gases"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_apparatus_id_apparatus_id_fk" FOREIGN KEY ("apparatus_id") REFERENCES "public"."apparatus"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signatures" ADD CONSTRAINT "signatures_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signatures" ADD CONSTRAINT "signatures_signer_id_people_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_uploaded_by_people_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "column_maps" ADD CONSTRAINT "column_maps_owner_id_people_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "project_members_person_idx" ON "project_members" USING btree ("person_id");--> statement-breakpoint
CREATE INDEX "calibrations_instrument_idx" ON "calibrations" USING btree ("instrument_id","calibrated_on");--> statement-breakpoint
CREATE INDEX "calibrations_due_idx" ON "calibrations" USING btree ("due_on");--> statement-breakpoint
CREATE INDEX "balance_results_run_idx" ON "balance_results" USING btree ("run_id","computed_at");--> statement-breakpoint
CREATE INDEX "mail_outbox_unsent_idx" ON "mail_outbox" USING btree ("sent_at","id");--> statement-breakpoint
CREATE UNIQUE INDEX "runs_code_revision_idx" ON "runs" USING btree ("code","revision");--> statement-breakpoint
CREATE INDEX "runs_state_updated_idx" ON "runs" USING btree ("state","updated_at");--> statement-breakpoint
CREATE INDEX "runs_project_idx" ON "runs" USING btree ("project_id","updated_at");--> statement-breakpoint
CREATE INDEX "runs_author_idx" ON "runs" USING btree ("author_id","updated_at");--> statement-breakpoint
CREATE INDEX "signatures_run_idx" ON "signatures" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "uploads_sha256_idx" ON "uploads" USING btree ("sha256");--> statement-breakpoint
CREATE INDEX "audit_events_entity_idx" ON "audit_events" USING btree ("entity_type","entity_id");--> statement-breakpoint
CREATE INDEX "audit_events_actor_idx" ON "audit_events" USING btree ("actor_id");--> statement-breakpoint
CREATE INDEX "audit_events_occurred_idx" ON "audit_events" USING btree ("occurred_at");--> statement-breakpoint
CREATE INDEX "imports_created_by_idx" ON "imports" USING btree ("created_by","created_at");