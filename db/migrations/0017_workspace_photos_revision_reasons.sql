ALTER TABLE "analyses" ADD COLUMN "reason" text;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "session_id" text;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "removed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_session_id_measurement_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."measurement_sessions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "photos_uploader_sha_idx" ON "photos" USING btree ("uploaded_by_user_id","sha256");