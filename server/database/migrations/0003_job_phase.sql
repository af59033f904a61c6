ALTER TABLE "results" ADD COLUMN "phase" text DEFAULT 'queued' NOT NULL;--> statement-breakpoint
ALTER TABLE "set_builds" ADD COLUMN "phase" text DEFAULT 'queued' NOT NULL;