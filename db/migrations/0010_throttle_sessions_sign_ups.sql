CREATE TABLE "pending_sign_ups" (
	"id" text PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"organization_name" text NOT NULL,
	"password_hash" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sessions" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "sign_in_attempts" ADD COLUMN "kind" text DEFAULT 'password' NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX "pending_sign_ups_token_hash_unique" ON "pending_sign_ups" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "pending_sign_ups_email_idx" ON "pending_sign_ups" USING btree ("email");