CREATE TABLE "walk_points" (
	"project_id" uuid NOT NULL,
	"id" uuid NOT NULL,
	"walk_id" uuid NOT NULL,
	"type" text NOT NULL,
	"recorded_at" timestamp with time zone NOT NULL,
	"data" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "walk_points_project_id_id_pk" PRIMARY KEY("project_id","id")
);
--> statement-breakpoint
ALTER TABLE "walk_points" ADD CONSTRAINT "walk_points_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "walk_points" ADD CONSTRAINT "walk_points_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "walk_points_walk_idx" ON "walk_points" USING btree ("project_id","walk_id");