CREATE TYPE "public"."care_event_kind" AS ENUM('blade_swap', 'blade_cleaned', 'housing_cleaned', 'roller_checked', 'spring_checked', 'other');--> statement-breakpoint
CREATE TYPE "public"."cutter_tool_kind" AS ENUM('blade', 'pen', 'laser');--> statement-breakpoint
CREATE TYPE "public"."cut_job_status" AS ENUM('planned', 'cutting', 'done', 'scrapped');--> statement-breakpoint
CREATE TABLE "blade_wear" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"blade_id" uuid NOT NULL,
	"job_id" uuid,
	"material_id" uuid,
	"cut_length_mm" double precision NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "blades" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"cutter_id" uuid NOT NULL,
	"blade_type" text NOT NULL,
	"angle_deg" double precision NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"fitted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"fitted_by" uuid,
	"retired_at" timestamp with time zone,
	"retired_by" uuid,
	"retire_reason" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"cutter_id" uuid NOT NULL,
	"kind" "care_event_kind" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"done_at" timestamp with time zone DEFAULT now() NOT NULL,
	"done_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cutters" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"tool_kind" "cutter_tool_kind" NOT NULL,
	"cutting_width_mm" double precision NOT NULL,
	"max_length_mm" double precision NOT NULL,
	"cut_speed_mm_s" double precision NOT NULL,
	"travel_speed_mm_s" double precision NOT NULL,
	"acceleration_mm_s2" double precision NOT NULL,
	"lift_lower_s" double precision NOT NULL,
	"corner_angle_deg" double precision DEFAULT 30 NOT NULL,
	"force_min" integer,
	"force_max" integer,
	"origin" text DEFAULT 'bottom-left' NOT NULL,
	"swap_axes" boolean DEFAULT false NOT NULL,
	"care_reminders" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "studio_settings" (
	"workspace_id" uuid PRIMARY KEY NOT NULL,
	"blade_wear_limits_m" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"due_soon_days" integer DEFAULT 7 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cut_job_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"from_status" "cut_job_status",
	"to_status" "cut_job_status" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"by_user_id" uuid,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cut_jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"title" text NOT NULL,
	"layout_id" uuid,
	"comparison_id" uuid,
	"material_id" uuid,
	"stock_item_id" uuid,
	"cutter_id" uuid,
	"quantity" integer DEFAULT 1 NOT NULL,
	"customer_name" text DEFAULT '' NOT NULL,
	"due_date" date,
	"notes" text DEFAULT '' NOT NULL,
	"status" "cut_job_status" DEFAULT 'planned' NOT NULL,
	"blade_id" uuid,
	"usage" jsonb,
	"remnant_stock_item_id" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"done_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "stock_items" ADD COLUMN "is_remnant" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "stock_items" ADD COLUMN "remnant_of_job_id" uuid;--> statement-breakpoint
ALTER TABLE "stock_items" ADD COLUMN "outline" jsonb;--> statement-breakpoint
ALTER TABLE "blade_wear" ADD CONSTRAINT "blade_wear_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blade_wear" ADD CONSTRAINT "blade_wear_blade_id_blades_id_fk" FOREIGN KEY ("blade_id") REFERENCES "public"."blades"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blade_wear" ADD CONSTRAINT "blade_wear_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blade_wear" ADD CONSTRAINT "blade_wear_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blades" ADD CONSTRAINT "blades_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blades" ADD CONSTRAINT "blades_cutter_id_cutters_id_fk" FOREIGN KEY ("cutter_id") REFERENCES "public"."cutters"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blades" ADD CONSTRAINT "blades_fitted_by_users_id_fk" FOREIGN KEY ("fitted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "blades" ADD CONSTRAINT "blades_retired_by_users_id_fk" FOREIGN KEY ("retired_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_events" ADD CONSTRAINT "care_events_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_events" ADD CONSTRAINT "care_events_cutter_id_cutters_id_fk" FOREIGN KEY ("cutter_id") REFERENCES "public"."cutters"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_events" ADD CONSTRAINT "care_events_done_by_users_id_fk" FOREIGN KEY ("done_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cutters" ADD CONSTRAINT "cutters_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cutters" ADD CONSTRAINT "cutters_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studio_settings" ADD CONSTRAINT "studio_settings_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_job_events" ADD CONSTRAINT "cut_job_events_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_job_events" ADD CONSTRAINT "cut_job_events_job_id_cut_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."cut_jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_job_events" ADD CONSTRAINT "cut_job_events_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_layout_id_layouts_id_fk" FOREIGN KEY ("layout_id") REFERENCES "public"."layouts"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_comparison_id_comparisons_id_fk" FOREIGN KEY ("comparison_id") REFERENCES "public"."comparisons"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_stock_item_id_stock_items_id_fk" FOREIGN KEY ("stock_item_id") REFERENCES "public"."stock_items"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_cutter_id_cutters_id_fk" FOREIGN KEY ("cutter_id") REFERENCES "public"."cutters"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_blade_id_blades_id_fk" FOREIGN KEY ("blade_id") REFERENCES "public"."blades"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_remnant_stock_item_id_stock_items_id_fk" FOREIGN KEY ("remnant_stock_item_id") REFERENCES "public"."stock_items"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cut_jobs" ADD CONSTRAINT "cut_jobs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "blade_wear_blade_idx" ON "blade_wear" USING btree ("blade_id");--> statement-breakpoint
CREATE UNIQUE INDEX "blade_wear_blade_job_idx" ON "blade_wear" USING btree ("blade_id","job_id");--> statement-breakpoint
CREATE INDEX "blades_cutter_idx" ON "blades" USING btree ("cutter_id","fitted_at");--> statement-breakpoint
CREATE INDEX "care_events_cutter_idx" ON "care_events" USING btree ("cutter_id","done_at");--> statement-breakpoint
CREATE INDEX "cutters_workspace_idx" ON "cutters" USING btree ("workspace_id","name");--> statement-breakpoint
CREATE INDEX "cut_job_events_job_idx" ON "cut_job_events" USING btree ("job_id","at");--> statement-breakpoint
CREATE UNIQUE INDEX "cut_jobs_workspace_number_idx" ON "cut_jobs" USING btree ("workspace_id","number");--> statement-breakpoint
CREATE INDEX "cut_jobs_workspace_status_idx" ON "cut_jobs" USING btree ("workspace_id","status","due_date");