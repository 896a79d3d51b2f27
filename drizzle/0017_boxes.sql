CREATE TYPE "public"."find_processing" AS ENUM('lifted', 'washed', 'marked', 'bagged', 'boxed', 'sent', 'returned');--> statement-breakpoint
CREATE TABLE "boxes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"store" text DEFAULT '' NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "finds" ADD COLUMN "processing" "find_processing" DEFAULT 'lifted' NOT NULL;--> statement-breakpoint
ALTER TABLE "finds" ADD COLUMN "sent_to" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "finds" ADD COLUMN "box_id" uuid;--> statement-breakpoint
ALTER TABLE "finds" ADD COLUMN "location" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "samples" ADD COLUMN "box_id" uuid;--> statement-breakpoint
ALTER TABLE "samples" ADD COLUMN "location" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "boxes" ADD CONSTRAINT "boxes_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "boxes" ADD CONSTRAINT "boxes_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "boxes_site_number" ON "boxes" USING btree ("site_id","number");--> statement-breakpoint
ALTER TABLE "finds" ADD CONSTRAINT "finds_box_id_boxes_id_fk" FOREIGN KEY ("box_id") REFERENCES "public"."boxes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_box_id_boxes_id_fk" FOREIGN KEY ("box_id") REFERENCES "public"."boxes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "finds_box" ON "finds" USING btree ("box_id");--> statement-breakpoint
CREATE INDEX "samples_box" ON "samples" USING btree ("box_id");