CREATE TABLE "error_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"family" text NOT NULL,
	"version" text NOT NULL,
	"kind" text NOT NULL,
	"member_count" integer NOT NULL,
	"confidence_level_percent" double precision NOT NULL,
	"x_min" double precision NOT NULL,
	"x_max" double precision NOT NULL,
	"q2_min" double precision NOT NULL,
	"q2_max" double precision NOT NULL,
	"target" jsonb NOT NULL,
	"header" jsonb NOT NULL,
	"axes" jsonb NOT NULL,
	"origin" text NOT NULL,
	"file_name" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"content" "bytea" NOT NULL,
	"added_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "error_sets_workspace_id_name_version_unique" UNIQUE("workspace_id","name","version")
);
--> statement-breakpoint
CREATE TABLE "measurements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"study_id" uuid NOT NULL,
	"name" text NOT NULL,
	"data" jsonb NOT NULL,
	"point_count" integer NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "result_bands" (
	"result_id" uuid NOT NULL,
	"prescription" text NOT NULL,
	"cl_percent" double precision NOT NULL,
	"bands" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "result_bands_pk" PRIMARY KEY("result_id","prescription","cl_percent")
);
--> statement-breakpoint
CREATE TABLE "result_reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"result_id" uuid NOT NULL,
	"action" text NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"actor_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "result_values" (
	"result_id" uuid PRIMARY KEY NOT NULL,
	"member_count" integer NOT NULL,
	"bin_count" integer NOT NULL,
	"values" "bytea" NOT NULL,
	"scale" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "results" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"study_id" uuid NOT NULL,
	"set_id" uuid NOT NULL,
	"second_set_id" uuid,
	"version" integer NOT NULL,
	"study_revision" integer NOT NULL,
	"spec_snapshot" jsonb NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"error" text,
	"cancel_requested" boolean DEFAULT false NOT NULL,
	"requested_by" uuid,
	"job_id" text,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"members_done" integer DEFAULT 0 NOT NULL,
	"members_total" integer NOT NULL,
	"bin_count" integer NOT NULL,
	"review_state" text DEFAULT 'draft' NOT NULL,
	"engine_version" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "results_study_id_set_id_version_unique" UNIQUE("study_id","set_id","version")
);
--> statement-breakpoint
CREATE TABLE "set_builds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"request" jsonb NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"error" text,
	"cancel_requested" boolean DEFAULT false NOT NULL,
	"requested_by" uuid,
	"job_id" text,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"progress_done" integer DEFAULT 0 NOT NULL,
	"progress_total" integer DEFAULT 0 NOT NULL,
	"set_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "studies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"spec" jsonb NOT NULL,
	"set_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	"second_set_id" uuid,
	"prescription" text DEFAULT 'auto' NOT NULL,
	"cl_percent" double precision DEFAULT 68 NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "error_sets" ADD CONSTRAINT "error_sets_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "error_sets" ADD CONSTRAINT "error_sets_added_by_users_id_fk" FOREIGN KEY ("added_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "result_bands" ADD CONSTRAINT "result_bands_result_id_results_id_fk" FOREIGN KEY ("result_id") REFERENCES "public"."results"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "result_reviews" ADD CONSTRAINT "result_reviews_result_id_results_id_fk" FOREIGN KEY ("result_id") REFERENCES "public"."results"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "result_reviews" ADD CONSTRAINT "result_reviews_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "result_values" ADD CONSTRAINT "result_values_result_id_results_id_fk" FOREIGN KEY ("result_id") REFERENCES "public"."results"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "results" ADD CONSTRAINT "results_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "results" ADD CONSTRAINT "results_set_id_error_sets_id_fk" FOREIGN KEY ("set_id") REFERENCES "public"."error_sets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "results" ADD CONSTRAINT "results_second_set_id_error_sets_id_fk" FOREIGN KEY ("second_set_id") REFERENCES "public"."error_sets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "results" ADD CONSTRAINT "results_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "set_builds" ADD CONSTRAINT "set_builds_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "set_builds" ADD CONSTRAINT "set_builds_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "set_builds" ADD CONSTRAINT "set_builds_set_id_error_sets_id_fk" FOREIGN KEY ("set_id") REFERENCES "public"."error_sets"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studies" ADD CONSTRAINT "studies_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studies" ADD CONSTRAINT "studies_second_set_id_error_sets_id_fk" FOREIGN KEY ("second_set_id") REFERENCES "public"."error_sets"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studies" ADD CONSTRAINT "studies_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "error_sets_workspace_id_idx" ON "error_sets" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "measurements_study_id_idx" ON "measurements" USING btree ("study_id");--> statement-breakpoint
CREATE INDEX "result_reviews_result_id_idx" ON "result_reviews" USING btree ("result_id");--> statement-breakpoint
CREATE INDEX "results_study_id_idx" ON "results" USING btree ("study_id");--> statement-breakpoint
CREATE INDEX "results_set_id_idx" ON "results" USING btree ("set_id");--> statement-breakpoint
CREATE INDEX "set_builds_workspace_id_idx" ON "set_builds" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "studies_workspace_id_idx" ON "studies" USING btree ("workspace_id");