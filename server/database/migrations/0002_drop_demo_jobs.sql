DROP TABLE "jobs" CASCADE;--> statement-breakpoint
DROP TYPE "public"."job_state";