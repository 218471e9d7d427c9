CREATE TYPE "public"."dynamic_kind" AS ENUM('grow-and-withdraw', 'growing', 'shrinking', 'tilt', 'over-time');--> statement-breakpoint
ALTER TYPE "public"."photo_purpose" ADD VALUE 'series-frame';--> statement-breakpoint
CREATE TABLE "dynamic_analyses" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"measurement_id" text NOT NULL,
	"revision" integer NOT NULL,
	"method" "analysis_method" NOT NULL,
	"options" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"series" jsonb NOT NULL,
	"advancing_deg" double precision,
	"advancing_sd_deg" double precision,
	"advancing_frames" integer,
	"receding_deg" double precision,
	"receding_sd_deg" double precision,
	"receding_frames" integer,
	"hysteresis_deg" double precision,
	"roll_off_deg" double precision,
	"frame_count" integer NOT NULL,
	"flagged_frame_count" integer NOT NULL,
	"software_version" text NOT NULL,
	"review_status" "review_status" DEFAULT 'draft' NOT NULL,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "dynamic_measurements" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"sample_id" text NOT NULL,
	"probe_liquid_id" text NOT NULL,
	"session_id" text,
	"kind" "dynamic_kind" NOT NULL,
	"source_type" text NOT NULL,
	"video_id" text,
	"frame_photo_ids" jsonb,
	"fps" double precision NOT NULL,
	"measured_at" timestamp with time zone DEFAULT now() NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "dynamic_measurements_one_source" CHECK (("dynamic_measurements"."video_id" is null) <> ("dynamic_measurements"."frame_photo_ids" is null))
);
--> statement-breakpoint
CREATE TABLE "videos" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"uploaded_by_user_id" text,
	"file_key" text NOT NULL,
	"url" text NOT NULL,
	"original_name" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"codec" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"fps" double precision,
	"frame_count" integer,
	"sha256" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "min_advancing_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "max_advancing_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "min_receding_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "max_receding_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "min_hysteresis_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "max_hysteresis_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "min_roll_off_deg" double precision;--> statement-breakpoint
ALTER TABLE "specs" ADD COLUMN "max_roll_off_deg" double precision;--> statement-breakpoint
ALTER TABLE "dynamic_analyses" ADD CONSTRAINT "dynamic_analyses_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_analyses" ADD CONSTRAINT "dynamic_analyses_measurement_id_dynamic_measurements_id_fk" FOREIGN KEY ("measurement_id") REFERENCES "public"."dynamic_measurements"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_analyses" ADD CONSTRAINT "dynamic_analyses_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_probe_liquid_id_probe_liquids_id_fk" FOREIGN KEY ("probe_liquid_id") REFERENCES "public"."probe_liquids"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_session_id_measurement_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."measurement_sessions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_video_id_videos_id_fk" FOREIGN KEY ("video_id") REFERENCES "public"."videos"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dynamic_measurements" ADD CONSTRAINT "dynamic_measurements_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "videos" ADD CONSTRAINT "videos_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "videos" ADD CONSTRAINT "videos_uploaded_by_user_id_users_id_fk" FOREIGN KEY ("uploaded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "dynamic_analyses_measurement_revision_unique" ON "dynamic_analyses" USING btree ("measurement_id","revision");--> statement-breakpoint
CREATE INDEX "dynamic_analyses_org_idx" ON "dynamic_analyses" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "dynamic_measurements_sample_idx" ON "dynamic_measurements" USING btree ("sample_id");--> statement-breakpoint
CREATE INDEX "dynamic_measurements_org_time_idx" ON "dynamic_measurements" USING btree ("organization_id","measured_at");--> statement-breakpoint
CREATE INDEX "dynamic_measurements_video_idx" ON "dynamic_measurements" USING btree ("video_id");--> statement-breakpoint
CREATE INDEX "videos_org_time_idx" ON "videos" USING btree ("organization_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "videos_file_key_unique" ON "videos" USING btree ("file_key");