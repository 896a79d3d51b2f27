CREATE TYPE "public"."datum_kind" AS ENUM('national', 'local');--> statement-breakpoint
CREATE TYPE "public"."dig_method" AS ENUM('trowel', 'mattock', 'machine', 'sieved');--> statement-breakpoint
CREATE TYPE "public"."level_target" AS ENUM('benchmark', 'change_point', 'find', 'context_top', 'context_base', 'spit_top', 'spit_base', 'ground', 'other');--> statement-breakpoint
CREATE TABLE "benchmarks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"code" text NOT NULL,
	"description" text NOT NULL,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	"level" double precision NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "level_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"trench_id" uuid,
	"taken_on" date NOT NULL,
	"start_benchmark_id" uuid NOT NULL,
	"closing_benchmark_id" uuid,
	"book" jsonb NOT NULL,
	"tolerance" double precision NOT NULL,
	"misclosure" double precision,
	"within_tolerance" boolean,
	"recorded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "spits" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"context_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"top_level" double precision,
	"base_level" double precision,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "spot_levels" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"run_id" uuid NOT NULL,
	"line" integer NOT NULL,
	"target" "level_target" NOT NULL,
	"target_id" uuid,
	"station" text NOT NULL,
	"level" double precision NOT NULL,
	"flagged" boolean DEFAULT false NOT NULL
);
--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "length_m" double precision;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "width_m" double precision;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "thickness_m" double precision;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "excavated_by" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "opened_on" date;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "closed_on" date;--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "dig_method" "dig_method";--> statement-breakpoint
ALTER TABLE "contexts" ADD COLUMN "sieve_mesh_mm" double precision;--> statement-breakpoint
ALTER TABLE "finds" ADD COLUMN "spit_id" uuid;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "datum_kind" "datum_kind" DEFAULT 'local' NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "datum_name" text DEFAULT 'Site datum' NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "level_tolerance" double precision DEFAULT 0.005 NOT NULL;--> statement-breakpoint
ALTER TABLE "trenches" ADD COLUMN "surface_level" double precision;--> statement-breakpoint
ALTER TABLE "benchmarks" ADD CONSTRAINT "benchmarks_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "benchmarks" ADD CONSTRAINT "benchmarks_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "level_runs" ADD CONSTRAINT "level_runs_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "level_runs" ADD CONSTRAINT "level_runs_trench_id_trenches_id_fk" FOREIGN KEY ("trench_id") REFERENCES "public"."trenches"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "level_runs" ADD CONSTRAINT "level_runs_start_benchmark_id_benchmarks_id_fk" FOREIGN KEY ("start_benchmark_id") REFERENCES "public"."benchmarks"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "level_runs" ADD CONSTRAINT "level_runs_closing_benchmark_id_benchmarks_id_fk" FOREIGN KEY ("closing_benchmark_id") REFERENCES "public"."benchmarks"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "level_runs" ADD CONSTRAINT "level_runs_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spits" ADD CONSTRAINT "spits_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spits" ADD CONSTRAINT "spits_context_id_contexts_id_fk" FOREIGN KEY ("context_id") REFERENCES "public"."contexts"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spits" ADD CONSTRAINT "spits_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spot_levels" ADD CONSTRAINT "spot_levels_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spot_levels" ADD CONSTRAINT "spot_levels_run_id_level_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."level_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "benchmarks_site_code" ON "benchmarks" USING btree ("site_id","code");--> statement-breakpoint
CREATE INDEX "level_runs_site" ON "level_runs" USING btree ("site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "spits_context_number" ON "spits" USING btree ("context_id","number");--> statement-breakpoint
CREATE INDEX "spot_levels_target" ON "spot_levels" USING btree ("target","target_id");--> statement-breakpoint
CREATE INDEX "spot_levels_run" ON "spot_levels" USING btree ("run_id");--> statement-breakpoint
ALTER TABLE "finds" ADD CONSTRAINT "finds_spit_id_spits_id_fk" FOREIGN KEY ("spit_id") REFERENCES "public"."spits"("id") ON DELETE restrict ON UPDATE no action;