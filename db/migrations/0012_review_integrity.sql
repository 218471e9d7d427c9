ALTER TYPE "public"."review_outcome" ADD VALUE 'revoked';--> statement-breakpoint
CREATE TABLE "review_items" (
	"review_id" text NOT NULL,
	"analysis_id" text NOT NULL,
	"open" boolean DEFAULT true NOT NULL,
	CONSTRAINT "review_items_review_id_analysis_id_pk" PRIMARY KEY("review_id","analysis_id")
);
--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "revoked_by_user_id" text;--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "revoked_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "revoke_reason" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "review_items" ADD CONSTRAINT "review_items_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_items" ADD CONSTRAINT "review_items_analysis_id_analyses_id_fk" FOREIGN KEY ("analysis_id") REFERENCES "public"."analyses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "review_items_open_analysis_unique" ON "review_items" USING btree ("analysis_id") WHERE "review_items"."open";--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_revoked_by_user_id_users_id_fk" FOREIGN KEY ("revoked_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;