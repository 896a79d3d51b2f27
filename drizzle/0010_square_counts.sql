CREATE TABLE "square_counts" (
	"sample_id" uuid NOT NULL,
	"class_id" uuid NOT NULL,
	"count" integer NOT NULL,
	"weight_g" double precision,
	CONSTRAINT "square_counts_sample_id_class_id_pk" PRIMARY KEY("sample_id","class_id")
);
--> statement-breakpoint
CREATE TABLE "square_samples" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid NOT NULL,
	"context_id" uuid NOT NULL,
	"spit_id" uuid,
	"col" integer NOT NULL,
	"row" integer NOT NULL,
	"excavated_area" double precision,
	"recorded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "square_samples_unit" UNIQUE NULLS NOT DISTINCT("context_id","spit_id","col","row")
);
--> statement-breakpoint
ALTER TABLE "trenches" ADD COLUMN "square_size" double precision;--> statement-breakpoint
ALTER TABLE "trenches" ADD COLUMN "square_origin_x" double precision;--> statement-breakpoint
ALTER TABLE "trenches" ADD COLUMN "square_origin_y" double precision;--> statement-breakpoint
ALTER TABLE "square_counts" ADD CONSTRAINT "square_counts_sample_id_square_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."square_samples"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_counts" ADD CONSTRAINT "square_counts_class_id_artefact_classes_id_fk" FOREIGN KEY ("class_id") REFERENCES "public"."artefact_classes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_samples" ADD CONSTRAINT "square_samples_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_samples" ADD CONSTRAINT "square_samples_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_samples" ADD CONSTRAINT "square_samples_context_id_contexts_id_fk" FOREIGN KEY ("context_id") REFERENCES "public"."contexts"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_samples" ADD CONSTRAINT "square_samples_spit_id_spits_id_fk" FOREIGN KEY ("spit_id") REFERENCES "public"."spits"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_samples" ADD CONSTRAINT "square_samples_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "square_counts_class" ON "square_counts" USING btree ("class_id");--> statement-breakpoint
CREATE INDEX "square_samples_trench" ON "square_samples" USING btree ("trench_id");