CREATE TYPE "public"."review_outcome" AS ENUM('submitted', 'approved', 'rejected', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."review_scope" AS ENUM('sample', 'batch');--> statement-breakpoint
CREATE TYPE "public"."tensiometry_kind" AS ENUM('wilhelmy-tension', 'wilhelmy-angle', 'water-check', 'pendant-drop');--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"scope" "review_scope" NOT NULL,
	"batch_id" text NOT NULL,
	"sample_id" text,
	"analysis_ids" jsonb NOT NULL,
	"status" "review_outcome" DEFAULT 'submitted' NOT NULL,
	"submitted_by_user_id" text,
	"submitted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"submit_note" text DEFAULT '' NOT NULL,
	"decided_by_user_id" text,
	"decided_at" timestamp with time zone,
	"decision_comment" text DEFAULT '' NOT NULL,
	"signature" jsonb
);
--> statement-breakpoint
CREATE TABLE "surface_energy_results" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"sample_id" text,
	"batch_id" text,
	"inputs" jsonb NOT NULL,
	"outputs" jsonb NOT NULL,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "surface_energy_results_one_subject" CHECK (("surface_energy_results"."sample_id" is null) <> ("surface_energy_results"."batch_id" is null))
);
--> statement-breakpoint
CREATE TABLE "tensiometry_results" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"kind" "tensiometry_kind" NOT NULL,
	"inputs" jsonb NOT NULL,
	"outputs" jsonb NOT NULL,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_submitted_by_user_id_users_id_fk" FOREIGN KEY ("submitted_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_decided_by_user_id_users_id_fk" FOREIGN KEY ("decided_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surface_energy_results" ADD CONSTRAINT "surface_energy_results_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surface_energy_results" ADD CONSTRAINT "surface_energy_results_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surface_energy_results" ADD CONSTRAINT "surface_energy_results_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "surface_energy_results" ADD CONSTRAINT "surface_energy_results_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tensiometry_results" ADD CONSTRAINT "tensiometry_results_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tensiometry_results" ADD CONSTRAINT "tensiometry_results_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "reviews_org_status_idx" ON "reviews" USING btree ("organization_id","status","submitted_at");--> statement-breakpoint
CREATE INDEX "reviews_batch_idx" ON "reviews" USING btree ("batch_id");--> statement-breakpoint
CREATE INDEX "surface_energy_results_sample_idx" ON "surface_energy_results" USING btree ("sample_id","created_at");--> statement-breakpoint
CREATE INDEX "surface_energy_results_batch_idx" ON "surface_energy_results" USING btree ("batch_id","created_at");--> statement-breakpoint
CREATE INDEX "surface_energy_results_org_idx" ON "surface_energy_results" USING btree ("organization_id","created_at");--> statement-breakpoint
CREATE INDEX "tensiometry_results_org_idx" ON "tensiometry_results" USING btree ("organization_id","kind","created_at");