ALTER TABLE "tensiometry_results" ADD COLUMN "photo_id" text;--> statement-breakpoint
ALTER TABLE "tensiometry_results" ADD CONSTRAINT "tensiometry_results_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tensiometry_results_photo_idx" ON "tensiometry_results" USING btree ("photo_id");