ALTER TABLE "apparatus" ADD COLUMN "rated_pressure_reference" text DEFAULT 'absolute' NOT NULL;--> statement-breakpoint
ALTER TABLE "apparatus" ADD CONSTRAINT "apparatus_rated_pressure_reference_check" CHECK ("rated_pressure_reference" IN ('absolute', 'gauge'));
