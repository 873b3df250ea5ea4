ALTER TABLE "mail_outbox" ADD COLUMN "dedupe_key" text;--> statement-breakpoint
CREATE UNIQUE INDEX "mail_outbox_dedupe_idx" ON "mail_outbox" USING btree ("dedupe_key","recipient");