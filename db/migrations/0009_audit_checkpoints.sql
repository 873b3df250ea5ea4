CREATE TABLE "audit_checkpoints" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"taken_at" timestamp (3) with time zone NOT NULL,
	"event_count" bigint NOT NULL,
	"head_id" bigint NOT NULL,
	"head_hash" text NOT NULL,
	"reason" text NOT NULL,
	"key_id" text NOT NULL,
	"signature" text NOT NULL
);
