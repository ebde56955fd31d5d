CREATE TYPE "public"."recipe_change_source" AS ENUM('created', 'tuned', 'suggestion', 'reset');--> statement-breakpoint
CREATE TYPE "public"."recipe_tool_kind" AS ENUM('blade', 'laser');--> statement-breakpoint
CREATE TYPE "public"."test_cut_outcome" AS ENUM('clean', 'not_through', 'torn', 'too_deep');--> statement-breakpoint
CREATE TYPE "public"."stock_item_kind" AS ENUM('sheet', 'roll');--> statement-breakpoint
CREATE TABLE "material_favourites" (
	"user_id" uuid NOT NULL,
	"material_id" uuid NOT NULL,
	"workspace_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "material_favourites_user_id_material_id_pk" PRIMARY KEY("user_id","material_id")
);
--> statement-breakpoint
CREATE TABLE "material_recipes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"material_id" uuid NOT NULL,
	"tool_kind" "recipe_tool_kind" NOT NULL,
	"blade_type" text,
	"blade_angle_deg" double precision,
	"force" integer,
	"passes" integer DEFAULT 1 NOT NULL,
	"speed_mm_s" double precision NOT NULL,
	"power_percent" double precision,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "material_settings" (
	"workspace_id" uuid PRIMARY KEY NOT NULL,
	"force_step" integer DEFAULT 15 NOT NULL,
	"force_min" integer DEFAULT 1 NOT NULL,
	"force_max" integer DEFAULT 400 NOT NULL,
	"power_step_percent" double precision DEFAULT 5 NOT NULL,
	"catalogue_version" integer DEFAULT 0 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "materials" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"catalogue_key" text,
	"name" text NOT NULL,
	"category" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"thickness_mm" double precision,
	"basis_weight_lb" double precision,
	"basis_weight_kind" text,
	"grammage_gsm" double precision,
	"laser_safe" boolean DEFAULT false NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recipe_changes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"material_id" uuid NOT NULL,
	"tool_kind" "recipe_tool_kind" NOT NULL,
	"field" text NOT NULL,
	"from_value" jsonb,
	"to_value" jsonb,
	"reason" text NOT NULL,
	"source" "recipe_change_source" NOT NULL,
	"test_cut_id" uuid,
	"changed_by" uuid,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_cut_photos" (
	"test_cut_id" uuid PRIMARY KEY NOT NULL,
	"workspace_id" uuid NOT NULL,
	"content_type" text NOT NULL,
	"byte_size" integer NOT NULL,
	"data" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_cuts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"material_id" uuid NOT NULL,
	"tool_kind" "recipe_tool_kind" NOT NULL,
	"recipe" jsonb NOT NULL,
	"recipe_version" integer NOT NULL,
	"cutter_id" uuid,
	"blade_id" uuid,
	"cutter_max_force" integer,
	"outcome" "test_cut_outcome" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"suggestion_applied_at" timestamp with time zone,
	"suggestion_applied_by" uuid,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "stock_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"kind" "stock_item_kind" NOT NULL,
	"width_mm" double precision NOT NULL,
	"height_mm" double precision,
	"length_mm" double precision,
	"margin_top_mm" double precision DEFAULT 0 NOT NULL,
	"margin_right_mm" double precision DEFAULT 0 NOT NULL,
	"margin_bottom_mm" double precision DEFAULT 0 NOT NULL,
	"margin_left_mm" double precision DEFAULT 0 NOT NULL,
	"material_id" uuid,
	"price" numeric(14, 4),
	"quantity_on_hand" integer DEFAULT 0 NOT NULL,
	"supplier_note" text DEFAULT '' NOT NULL,
	"archived_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "material_favourites" ADD CONSTRAINT "material_favourites_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_favourites" ADD CONSTRAINT "material_favourites_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_favourites" ADD CONSTRAINT "material_favourites_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_recipes" ADD CONSTRAINT "material_recipes_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_recipes" ADD CONSTRAINT "material_recipes_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_recipes" ADD CONSTRAINT "material_recipes_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "material_settings" ADD CONSTRAINT "material_settings_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "materials" ADD CONSTRAINT "materials_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "materials" ADD CONSTRAINT "materials_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recipe_changes" ADD CONSTRAINT "recipe_changes_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recipe_changes" ADD CONSTRAINT "recipe_changes_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recipe_changes" ADD CONSTRAINT "recipe_changes_test_cut_id_test_cuts_id_fk" FOREIGN KEY ("test_cut_id") REFERENCES "public"."test_cuts"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recipe_changes" ADD CONSTRAINT "recipe_changes_changed_by_users_id_fk" FOREIGN KEY ("changed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cut_photos" ADD CONSTRAINT "test_cut_photos_test_cut_id_test_cuts_id_fk" FOREIGN KEY ("test_cut_id") REFERENCES "public"."test_cuts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cut_photos" ADD CONSTRAINT "test_cut_photos_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cuts" ADD CONSTRAINT "test_cuts_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cuts" ADD CONSTRAINT "test_cuts_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cuts" ADD CONSTRAINT "test_cuts_suggestion_applied_by_users_id_fk" FOREIGN KEY ("suggestion_applied_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_cuts" ADD CONSTRAINT "test_cuts_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_items" ADD CONSTRAINT "stock_items_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_items" ADD CONSTRAINT "stock_items_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_items" ADD CONSTRAINT "stock_items_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "material_favourites_workspace_idx" ON "material_favourites" USING btree ("workspace_id","user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "material_recipes_material_tool_idx" ON "material_recipes" USING btree ("material_id","tool_kind");--> statement-breakpoint
CREATE UNIQUE INDEX "materials_catalogue_key_idx" ON "materials" USING btree ("workspace_id","catalogue_key");--> statement-breakpoint
CREATE INDEX "materials_workspace_name_idx" ON "materials" USING btree ("workspace_id","name");--> statement-breakpoint
CREATE INDEX "recipe_changes_material_idx" ON "recipe_changes" USING btree ("material_id","changed_at");--> statement-breakpoint
CREATE INDEX "test_cuts_material_idx" ON "test_cuts" USING btree ("material_id","created_at");--> statement-breakpoint
CREATE INDEX "stock_items_workspace_idx" ON "stock_items" USING btree ("workspace_id","name");--> statement-breakpoint
CREATE INDEX "stock_items_material_idx" ON "stock_items" USING btree ("material_id");