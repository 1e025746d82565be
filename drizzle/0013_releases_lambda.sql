ALTER TABLE "releases" ADD COLUMN "lambda_index" integer NOT NULL;--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "lambda_index" integer NOT NULL;