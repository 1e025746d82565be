CREATE TABLE "fit_evaluations" (
	"fit_id" uuid NOT NULL,
	"lambda_index" integer NOT NULL,
	"state" text NOT NULL,
	"message" text,
	"result" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fit_evaluations_fit_id_lambda_index_pk" PRIMARY KEY("fit_id","lambda_index")
);
--> statement-breakpoint
CREATE TABLE "fit_folds" (
	"fit_id" uuid NOT NULL,
	"fold" integer NOT NULL,
	"worker" text NOT NULL,
	"attempt" integer NOT NULL,
	"n_test" integer NOT NULL,
	"losses" jsonb NOT NULL,
	"support" "bytea" NOT NULL,
	"time_ms" integer NOT NULL,
	"finished_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fit_folds_fit_id_fold_pk" PRIMARY KEY("fit_id","fold")
);
--> statement-breakpoint
CREATE TABLE "fits" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"model_id" uuid NOT NULL,
	"workspace_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"spec" jsonb NOT NULL,
	"dataset_version_id" uuid NOT NULL,
	"dataset_sha256" text NOT NULL,
	"engine_version" text NOT NULL,
	"seed" integer,
	"status" text NOT NULL,
	"unconverged" boolean DEFAULT false NOT NULL,
	"message" text,
	"progress" jsonb NOT NULL,
	"timings" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"results" jsonb,
	"coefficients" "bytea",
	"standardized_coefficients" "bytea",
	"selection_counts" "bytea",
	"chosen_index" integer,
	"chosen_rule" text,
	"chosen_by" uuid,
	"chosen_at" timestamp with time zone,
	"key_metrics" jsonb,
	CONSTRAINT "fits_version_unique" UNIQUE("model_id","version")
);
--> statement-breakpoint
CREATE TABLE "models" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"dataset_id" uuid NOT NULL,
	"outcome" text NOT NULL,
	"family" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "models_name_unique" UNIQUE("workspace_id","name")
);
--> statement-breakpoint
ALTER TABLE "fit_evaluations" ADD CONSTRAINT "fit_evaluations_fit_id_fits_id_fk" FOREIGN KEY ("fit_id") REFERENCES "public"."fits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fit_folds" ADD CONSTRAINT "fit_folds_fit_id_fits_id_fk" FOREIGN KEY ("fit_id") REFERENCES "public"."fits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_model_id_models_id_fk" FOREIGN KEY ("model_id") REFERENCES "public"."models"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_dataset_version_id_dataset_versions_id_fk" FOREIGN KEY ("dataset_version_id") REFERENCES "public"."dataset_versions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_chosen_by_users_id_fk" FOREIGN KEY ("chosen_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "models" ADD CONSTRAINT "models_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "models" ADD CONSTRAINT "models_dataset_id_datasets_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."datasets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "models" ADD CONSTRAINT "models_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fits_workspace_idx" ON "fits" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "fits_dataset_version_idx" ON "fits" USING btree ("dataset_version_id");--> statement-breakpoint
CREATE INDEX "models_dataset_idx" ON "models" USING btree ("dataset_id");