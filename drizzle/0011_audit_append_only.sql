-- The audit log is append-only: rows are inserted, never changed or removed. The table has no foreign
-- keys, so no cascade ever needs to touch it.
CREATE OR REPLACE FUNCTION lariat_refuse_audit_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'the audit log is append-only (% refused)', TG_OP;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER audit_events_append_only BEFORE UPDATE OR DELETE ON audit_events FOR EACH ROW EXECUTE FUNCTION lariat_refuse_audit_change();
--> statement-breakpoint
CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events FOR EACH STATEMENT EXECUTE FUNCTION lariat_refuse_audit_change();
--> statement-breakpoint
-- A release row is history too: it never changes once written (released_by may become NULL when the
-- account is deleted).
CREATE OR REPLACE FUNCTION lariat_guard_release_update() RETURNS trigger AS $$
BEGIN
  IF (to_jsonb(NEW) - 'released_by' - 'review_id') IS DISTINCT FROM (to_jsonb(OLD) - 'released_by' - 'review_id') THEN
    RAISE EXCEPTION 'a release never changes (release %)', OLD.id;
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER releases_guard BEFORE UPDATE ON releases FOR EACH ROW EXECUTE FUNCTION lariat_guard_release_update();
