-- Dataset versions, uploads, file chunks and stored columns are immutable: refuse UPDATE.
-- The one allowed change is created_by becoming NULL when the user account is deleted (ON DELETE SET NULL).
CREATE OR REPLACE FUNCTION lariat_refuse_dataset_update() RETURNS trigger AS $$
BEGIN
  IF (to_jsonb(NEW) - 'created_by') IS DISTINCT FROM (to_jsonb(OLD) - 'created_by') THEN
    RAISE EXCEPTION 'dataset versions and their stored files are immutable (table %)', TG_TABLE_NAME;
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER dataset_versions_immutable BEFORE UPDATE ON dataset_versions FOR EACH ROW EXECUTE FUNCTION lariat_refuse_dataset_update();
--> statement-breakpoint
CREATE TRIGGER dataset_uploads_immutable BEFORE UPDATE ON dataset_uploads FOR EACH ROW EXECUTE FUNCTION lariat_refuse_dataset_update();
--> statement-breakpoint
CREATE TRIGGER dataset_file_chunks_immutable BEFORE UPDATE ON dataset_file_chunks FOR EACH ROW EXECUTE FUNCTION lariat_refuse_dataset_update();
--> statement-breakpoint
CREATE TRIGGER dataset_columns_immutable BEFORE UPDATE ON dataset_columns FOR EACH ROW EXECUTE FUNCTION lariat_refuse_dataset_update();
