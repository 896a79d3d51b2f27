CREATE TYPE "public"."package_status" AS ENUM('queued', 'running', 'done', 'failed');--> statement-breakpoint
CREATE TABLE "deposition_packages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid,
	"status" "package_status" DEFAULT 'queued' NOT NULL,
	"files_done" integer DEFAULT 0 NOT NULL,
	"files_total" integer DEFAULT 0 NOT NULL,
	"file_name" text,
	"file_path" text,
	"bytes" bigint,
	"fingerprint" text,
	"error" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "deposition_packages" ADD CONSTRAINT "deposition_packages_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "deposition_packages" ADD CONSTRAINT "deposition_packages_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "deposition_packages" ADD CONSTRAINT "deposition_packages_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "deposition_packages_site" ON "deposition_packages" USING btree ("site_id");