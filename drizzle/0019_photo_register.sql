CREATE TYPE "public"."photo_date_source" AS ENUM('camera', 'upload');--> statement-breakpoint
CREATE TYPE "public"."photo_kind" AS ENUM('plan', 'record');--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "kind" "photo_kind" DEFAULT 'plan' NOT NULL;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "context_id" uuid;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "find_id" uuid;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "number" integer;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "facing" integer;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "scale" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "caption" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "taken_by" uuid;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "taken_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "taken_at_source" "photo_date_source";--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "client_key" text;--> statement-breakpoint
ALTER TABLE "photos" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "next_photo_number" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_context_id_contexts_id_fk" FOREIGN KEY ("context_id") REFERENCES "public"."contexts"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_find_id_finds_id_fk" FOREIGN KEY ("find_id") REFERENCES "public"."finds"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_taken_by_users_id_fk" FOREIGN KEY ("taken_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "photos_site_number" ON "photos" USING btree ("site_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "photos_site_client_key" ON "photos" USING btree ("site_id","client_key");--> statement-breakpoint
CREATE INDEX "photos_context" ON "photos" USING btree ("context_id");--> statement-breakpoint
CREATE INDEX "photos_find" ON "photos" USING btree ("find_id");--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_record_subject" CHECK ("photos"."kind" = 'plan' or ("photos"."number" is not null and num_nonnulls("photos"."context_id", "photos"."find_id", "photos"."trench_id") = 1));