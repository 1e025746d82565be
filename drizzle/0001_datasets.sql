CREATE TABLE "dataset_columns" (
	"upload_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"name" text NOT NULL,
	"storage" text NOT NULL,
	"levels" jsonb,
	"data" "bytea" NOT NULL,
	CONSTRAINT "dataset_columns_upload_id_position_pk" PRIMARY KEY("upload_id","position")
);
--> statement-breakpoint
CREATE TABLE "dataset_file_chunks" (
	"upload_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"data" "bytea" NOT NULL,
	CONSTRAINT "dataset_file_chunks_upload_id_seq_pk" PRIMARY KEY("upload_id","seq")
);
--> statement-breakpoint
CREATE TABLE "dataset_uploads" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"dataset_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"sha256" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"row_count" integer NOT NULL,
	"column_count" integer NOT NULL,
	"report" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "dataset_uploads_checksum_unique" UNIQUE("dataset_id","sha256")
);
--> statement-breakpoint
CREATE TABLE "dataset_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"dataset_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"upload_id" uuid NOT NULL,
	"origin" text NOT NULL,
	"based_on" integer,
	"columns" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "dataset_versions_number_unique" UNIQUE("dataset_id","number")
);
--> statement-breakpoint
CREATE TABLE "datasets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"open_key" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "dataset_columns" ADD CONSTRAINT "dataset_columns_upload_id_dataset_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."dataset_uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_file_chunks" ADD CONSTRAINT "dataset_file_chunks_upload_id_dataset_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."dataset_uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_uploads" ADD CONSTRAINT "dataset_uploads_dataset_id_datasets_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."datasets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_versions" ADD CONSTRAINT "dataset_versions_dataset_id_datasets_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."datasets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_versions" ADD CONSTRAINT "dataset_versions_upload_id_dataset_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."dataset_uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_versions" ADD CONSTRAINT "dataset_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "datasets" ADD CONSTRAINT "datasets_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "datasets" ADD CONSTRAINT "datasets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "dataset_versions_upload_idx" ON "dataset_versions" USING btree ("upload_id");--> statement-breakpoint
CREATE INDEX "datasets_workspace_idx" ON "datasets" USING btree ("workspace_id");