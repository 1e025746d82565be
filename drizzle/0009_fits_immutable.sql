-- A fit is an immutable version once it has ended (finished, failed or cancelled): only the chosen
-- lambda (chosen_*) may change after that, and created_by / chosen_by may become NULL when an account
-- is deleted (ON DELETE SET NULL). Its spec, dataset version, checksum, engine version and seed never change.
CREATE OR REPLACE FUNCTION lariat_guard_fit_update() RETURNS trigger AS $$
BEGIN
  IF (to_jsonb(NEW) - 'created_by' - 'chosen_by') IS NOT DISTINCT FROM (to_jsonb(OLD) - 'created_by' - 'chosen_by') THEN
    RETURN NEW;
  END IF;
  IF (NEW.spec, NEW.dataset_version_id, NEW.dataset_sha256, NEW.engine_version, NEW.seed, NEW.version, NEW.model_id)
     IS DISTINCT FROM (OLD.spec, OLD.dataset_version_id, OLD.dataset_sha256, OLD.engine_version, OLD.seed, OLD.version, OLD.model_id) THEN
    RAISE EXCEPTION 'a fit''s spec, data and engine version are immutable (fit %)', OLD.id;
  END IF;
  IF OLD.status IN ('finished', 'failed', 'cancelled')
     AND (to_jsonb(NEW) - 'created_by' - 'chosen_by' - 'chosen_index' - 'chosen_rule' - 'chosen_at' - 'key_metrics')
         IS DISTINCT FROM (to_jsonb(OLD) - 'created_by' - 'chosen_by' - 'chosen_index' - 'chosen_rule' - 'chosen_at' - 'key_metrics') THEN
    RAISE EXCEPTION 'fit % has ended (%): only the chosen lambda may change', OLD.id, OLD.status;
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER fits_guard BEFORE UPDATE ON fits FOR EACH ROW EXECUTE FUNCTION lariat_guard_fit_update();
--> statement-breakpoint
CREATE TRIGGER fit_folds_immutable BEFORE UPDATE ON fit_folds FOR EACH ROW EXECUTE FUNCTION lariat_refuse_dataset_update();
