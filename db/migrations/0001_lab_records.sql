CREATE TYPE "public"."review_status" AS ENUM('draft', 'submitted', 'approved', 'rejected');--> statement-breakpoint
CREATE TYPE "public"."spec_scope" AS ENUM('each-drop', 'mean');--> statement-breakpoint
CREATE TABLE "analyses" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"drop_id" text NOT NULL,
	"revision" integer NOT NULL,
	"method" text NOT NULL,
	"baseline" jsonb,
	"options" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"left_deg" double precision NOT NULL,
	"right_deg" double precision NOT NULL,
	"mean_deg" double precision NOT NULL,
	"left_uncertainty_deg" double precision,
	"right_uncertainty_deg" double precision,
	"software_version" text NOT NULL,
	"review_status" "review_status" DEFAULT 'draft' NOT NULL,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "batches" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"coating_id" text NOT NULL,
	"lot_code" text NOT NULL,
	"produced_on" date NOT NULL,
	"process" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "coatings" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "drops" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"sample_id" text NOT NULL,
	"probe_liquid_id" text NOT NULL,
	"session_id" text,
	"photo_id" text,
	"source" text DEFAULT 'photo' NOT NULL,
	"measured_at" timestamp with time zone DEFAULT now() NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "measurement_sessions" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"operator_name" text NOT NULL,
	"measured_at" timestamp with time zone NOT NULL,
	"probe_liquid_id" text,
	"temperature_c" double precision,
	"humidity_pct" double precision,
	"drop_volume_ul" double precision,
	"scale_px_per_mm" double precision,
	"instrument_notes" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"uploaded_by_user_id" text,
	"file_key" text NOT NULL,
	"url" text NOT NULL,
	"original_name" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"format" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bit_depth" integer NOT NULL,
	"sha256" text NOT NULL,
	"thumbnail_png" "bytea" NOT NULL,
	"working_png" "bytea",
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "probe_liquids" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text,
	"name" text NOT NULL,
	"total_mn_m" double precision NOT NULL,
	"dispersive_mn_m" double precision,
	"polar_mn_m" double precision,
	"lw_mn_m" double precision,
	"acid_mn_m" double precision,
	"base_mn_m" double precision,
	"density_g_per_cm3" double precision,
	"sources" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"hazard_note" text,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "samples" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"batch_id" text NOT NULL,
	"label" text NOT NULL,
	"substrate" text DEFAULT '' NOT NULL,
	"position" text DEFAULT '' NOT NULL,
	"treated_at" timestamp with time zone,
	"notes" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "specs" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"coating_id" text NOT NULL,
	"probe_liquid_id" text NOT NULL,
	"min_deg" double precision,
	"max_deg" double precision,
	"scope" "spec_scope" NOT NULL,
	"min_surface_energy_mn_m" double precision,
	"max_surface_energy_mn_m" double precision,
	"max_days_since_treatment" double precision,
	"note" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_drop_id_drops_id_fk" FOREIGN KEY ("drop_id") REFERENCES "public"."drops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batches" ADD CONSTRAINT "batches_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batches" ADD CONSTRAINT "batches_coating_id_coatings_id_fk" FOREIGN KEY ("coating_id") REFERENCES "public"."coatings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batches" ADD CONSTRAINT "batches_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coatings" ADD CONSTRAINT "coatings_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coatings" ADD CONSTRAINT "coatings_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_probe_liquid_id_probe_liquids_id_fk" FOREIGN KEY ("probe_liquid_id") REFERENCES "public"."probe_liquids"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_session_id_measurement_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."measurement_sessions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drops" ADD CONSTRAINT "drops_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurement_sessions" ADD CONSTRAINT "measurement_sessions_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurement_sessions" ADD CONSTRAINT "measurement_sessions_probe_liquid_id_probe_liquids_id_fk" FOREIGN KEY ("probe_liquid_id") REFERENCES "public"."probe_liquids"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurement_sessions" ADD CONSTRAINT "measurement_sessions_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_user_id_users_id_fk" FOREIGN KEY ("uploaded_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "probe_liquids" ADD CONSTRAINT "probe_liquids_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "specs" ADD CONSTRAINT "specs_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "specs" ADD CONSTRAINT "specs_coating_id_coatings_id_fk" FOREIGN KEY ("coating_id") REFERENCES "public"."coatings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "specs" ADD CONSTRAINT "specs_probe_liquid_id_probe_liquids_id_fk" FOREIGN KEY ("probe_liquid_id") REFERENCES "public"."probe_liquids"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "analyses_drop_revision_unique" ON "analyses" USING btree ("drop_id","revision");--> statement-breakpoint
CREATE INDEX "analyses_org_idx" ON "analyses" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "batches_org_lot_unique" ON "batches" USING btree ("organization_id","lot_code");--> statement-breakpoint
CREATE INDEX "batches_coating_idx" ON "batches" USING btree ("coating_id","produced_on");--> statement-breakpoint
CREATE UNIQUE INDEX "coatings_org_code_unique" ON "coatings" USING btree ("organization_id","code");--> statement-breakpoint
CREATE INDEX "drops_sample_idx" ON "drops" USING btree ("sample_id");--> statement-breakpoint
CREATE INDEX "drops_org_time_idx" ON "drops" USING btree ("organization_id","measured_at");--> statement-breakpoint
CREATE INDEX "measurement_sessions_org_time_idx" ON "measurement_sessions" USING btree ("organization_id","measured_at");--> statement-breakpoint
CREATE INDEX "photos_org_time_idx" ON "photos" USING btree ("organization_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "photos_file_key_unique" ON "photos" USING btree ("file_key");--> statement-breakpoint
CREATE INDEX "probe_liquids_org_idx" ON "probe_liquids" USING btree ("organization_id");--> statement-breakpoint
CREATE UNIQUE INDEX "samples_batch_label_unique" ON "samples" USING btree ("batch_id","label");--> statement-breakpoint
CREATE INDEX "samples_org_idx" ON "samples" USING btree ("organization_id");--> statement-breakpoint
CREATE INDEX "specs_coating_idx" ON "specs" USING btree ("coating_id");