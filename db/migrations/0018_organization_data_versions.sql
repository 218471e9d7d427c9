CREATE SEQUENCE "public"."organization_data_version_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "organization_data_versions" (
	"organization_id" text PRIMARY KEY NOT NULL,
	"version" bigint NOT NULL
);
