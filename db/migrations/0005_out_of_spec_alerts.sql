CREATE TABLE "batch_verdicts" (
	"batch_id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"outcome" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "coating_watchers" (
	"coating_id" text NOT NULL,
	"user_id" text NOT NULL,
	"organization_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "coating_watchers_coating_id_user_id_pk" PRIMARY KEY("coating_id","user_id")
);
--> statement-breakpoint
ALTER TABLE "batch_verdicts" ADD CONSTRAINT "batch_verdicts_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batch_verdicts" ADD CONSTRAINT "batch_verdicts_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coating_watchers" ADD CONSTRAINT "coating_watchers_coating_id_coatings_id_fk" FOREIGN KEY ("coating_id") REFERENCES "public"."coatings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coating_watchers" ADD CONSTRAINT "coating_watchers_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "coating_watchers" ADD CONSTRAINT "coating_watchers_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;