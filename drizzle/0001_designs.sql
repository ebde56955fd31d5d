CREATE TABLE "designs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"tags" text[] DEFAULT '{}' NOT NULL,
	"original_filename" text NOT NULL,
	"sanitized_svg" text NOT NULL,
	"width_mm" double precision NOT NULL,
	"height_mm" double precision NOT NULL,
	"bbox_min_x" double precision NOT NULL,
	"bbox_min_y" double precision NOT NULL,
	"bbox_max_x" double precision NOT NULL,
	"bbox_max_y" double precision NOT NULL,
	"area_mm2" double precision NOT NULL,
	"cut_length_mm" double precision NOT NULL,
	"piece_count" integer NOT NULL,
	"hole_count" integer NOT NULL,
	"cut_line_count" integer NOT NULL,
	"keep_together" boolean DEFAULT true NOT NULL,
	"tolerance_mm" double precision NOT NULL,
	"geometry" jsonb NOT NULL,
	"preview" jsonb NOT NULL,
	"warnings" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "designs" ADD CONSTRAINT "designs_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "designs" ADD CONSTRAINT "designs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "designs_workspace_idx" ON "designs" USING btree ("workspace_id","created_at");