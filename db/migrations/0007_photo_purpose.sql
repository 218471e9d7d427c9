CREATE TYPE "public"."photo_purpose" AS ENUM('sessile-drop', 'pendant-drop');--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "purpose" "photo_purpose" DEFAULT 'sessile-drop' NOT NULL;--> statement-breakpoint
-- Photos already kept with a pendant-drop result were hanging drops.
UPDATE "photos" SET "purpose" = 'pendant-drop' WHERE "id" IN (SELECT "photo_id" FROM "tensiometry_results" WHERE "photo_id" IS NOT NULL);
