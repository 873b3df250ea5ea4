ALTER TABLE "readings" DROP CONSTRAINT "readings_run_id_runs_id_fk";
