CREATE TYPE "public"."drawing_kind" AS ENUM('plan', 'section');--> statement-breakpoint
CREATE TABLE "drawing_contexts" (
	"drawing_id" uuid NOT NULL,
	"context_id" uuid NOT NULL,
	CONSTRAINT "drawing_contexts_drawing_id_context_id_pk" PRIMARY KEY("drawing_id","context_id")
);
--> statement-breakpoint
CREATE TABLE "drawings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"kind" "drawing_kind" NOT NULL,
	"scale" integer NOT NULL,
	"title" text DEFAULT '' NOT NULL,
	"drawn_by" uuid,
	"drawn_on" date NOT NULL,
	"recorded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "next_drawing_number" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "drawing_contexts" ADD CONSTRAINT "drawing_contexts_drawing_id_drawings_id_fk" FOREIGN KEY ("drawing_id") REFERENCES "public"."drawings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drawing_contexts" ADD CONSTRAINT "drawing_contexts_context_id_contexts_id_fk" FOREIGN KEY ("context_id") REFERENCES "public"."contexts"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drawings" ADD CONSTRAINT "drawings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drawings" ADD CONSTRAINT "drawings_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drawings" ADD CONSTRAINT "drawings_drawn_by_users_id_fk" FOREIGN KEY ("drawn_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drawings" ADD CONSTRAINT "drawings_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "drawing_contexts_context" ON "drawing_contexts" USING btree ("context_id");--> statement-breakpoint
CREATE UNIQUE INDEX "drawings_site_number" ON "drawings" USING btree ("site_id","number");--> statement-breakpoint
CREATE INDEX "drawings_trench" ON "drawings" USING btree ("trench_id");