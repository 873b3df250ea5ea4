CREATE INDEX "runs_updated_idx" ON "runs" USING btree ("updated_at","id");--> statement-breakpoint
CREATE INDEX "runs_created_idx" ON "runs" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "runs_run_date_idx" ON "runs" USING btree ("run_date");