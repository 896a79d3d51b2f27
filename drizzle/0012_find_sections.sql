CREATE TABLE "find_sections" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid NOT NULL,
	"name" text NOT NULL,
	"start_x" double precision NOT NULL,
	"start_y" double precision NOT NULL,
	"end_x" double precision NOT NULL,
	"end_y" double precision NOT NULL,
	"half_width" double precision NOT NULL,
	"exaggeration" double precision NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "find_sections" ADD CONSTRAINT "find_sections_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "find_sections" ADD CONSTRAINT "find_sections_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "find_sections" ADD CONSTRAINT "find_sections_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "find_sections_trench_name" ON "find_sections" USING btree ("trench_id","name");