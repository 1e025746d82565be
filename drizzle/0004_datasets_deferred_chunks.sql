-- The original file's chunks are written while the file is still being parsed, before the upload
-- row (which needs the parse's counts) exists: check their foreign key at commit instead.
ALTER TABLE "dataset_file_chunks" DROP CONSTRAINT "dataset_file_chunks_upload_id_dataset_uploads_id_fk";
--> statement-breakpoint
ALTER TABLE "dataset_file_chunks" ADD CONSTRAINT "dataset_file_chunks_upload_id_dataset_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."dataset_uploads"("id") ON DELETE cascade ON UPDATE no action DEFERRABLE INITIALLY DEFERRED;
