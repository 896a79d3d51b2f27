CREATE TYPE "public"."sample_status" AS ENUM('taken', 'processing', 'processed', 'sent', 'discarded');--> statement-breakpoint
CREATE TYPE "public"."sample_type" AS ENUM('bulk', 'spot', 'charcoal', 'monolith', 'micromorphology', 'pollen', 'luminescence', 'other');--> statement-breakpoint
CREATE TABLE "samples" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid NOT NULL,
	"context_id" uuid NOT NULL,
	"spit_id" uuid,
	"number" integer NOT NULL,
	"type" "sample_type" NOT NULL,
	"x" double precision,
	"y" double precision,
	"z" double precision,
	"volume_l" double precision,
	"purpose" text DEFAULT '' NOT NULL,
	"taken_by" uuid,
	"taken_on" date NOT NULL,
	"status" "sample_status" DEFAULT 'taken' NOT NULL,
	"recorded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "samples_share_find_numbers" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "next_sample_number" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "label_address" text;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_context_id_contexts_id_fk" FOREIGN KEY ("context_id") REFERENCES "public"."contexts"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_spit_id_spits_id_fk" FOREIGN KEY ("spit_id") REFERENCES "public"."spits"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_taken_by_users_id_fk" FOREIGN KEY ("taken_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "samples_site_number" ON "samples" USING btree ("site_id","number");--> statement-breakpoint
CREATE INDEX "samples_context" ON "samples" USING btree ("context_id");