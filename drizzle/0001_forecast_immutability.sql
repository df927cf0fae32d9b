-- Approved forecast versions are immutable, and superseded ones are history: once a version
-- leaves draft, its numbers (points, adjustments) and its identity (fit, origin, horizon, approval
-- time) cannot change. The only change allowed is approved -> superseded. Deletes stay possible
-- (a deleted series takes its versions with it), and ON DELETE SET NULL of people and runs still
-- works because those columns are not frozen. Violations raise SQLSTATE 55000
-- (object_not_in_prerequisite_state).
CREATE FUNCTION forecast_versions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF OLD.state = 'draft' THEN
    RETURN NEW;
  END IF;
  IF (NEW.id, NEW.series_id, NEW.fit_id, NEW.issued_at, NEW.origin, NEW.horizon_hours, NEW.levels, NEW.warnings, NEW.approved_at)
     IS DISTINCT FROM
     (OLD.id, OLD.series_id, OLD.fit_id, OLD.issued_at, OLD.origin, OLD.horizon_hours, OLD.levels, OLD.warnings, OLD.approved_at)
     OR (OLD.state = 'approved' AND NEW.state NOT IN ('approved', 'superseded'))
     OR (OLD.state = 'superseded' AND (NEW.state <> 'superseded' OR NEW.superseded_at IS DISTINCT FROM OLD.superseded_at)) THEN
    RAISE EXCEPTION 'forecast version % is %: only a draft can change (an approved version may only be superseded)', OLD.id, OLD.state
      USING ERRCODE = '55000';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER forecast_versions_immutable_after_draft
  BEFORE UPDATE ON forecast_versions
  FOR EACH ROW EXECUTE FUNCTION forecast_versions_guard();
--> statement-breakpoint
-- Points and adjustments may be written only while their version is a draft. Statement-level
-- triggers with transition tables check a whole batch (168 points) in one query. When the version
-- row itself is being deleted it is no longer visible here, so cascading deletes pass.
CREATE FUNCTION forecast_version_children_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  locked_id bigint;
  locked_state forecast_state;
BEGIN
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    SELECT v.id, v.state INTO locked_id, locked_state
      FROM new_rows n JOIN forecast_versions v ON v.id = n.version_id WHERE v.state <> 'draft' LIMIT 1;
  END IF;
  IF locked_id IS NULL AND TG_OP IN ('UPDATE', 'DELETE') THEN
    SELECT v.id, v.state INTO locked_id, locked_state
      FROM old_rows o JOIN forecast_versions v ON v.id = o.version_id WHERE v.state <> 'draft' LIMIT 1;
  END IF;
  IF locked_id IS NOT NULL THEN
    RAISE EXCEPTION 'forecast version % is %: its % cannot change', locked_id, locked_state, TG_TABLE_NAME
      USING ERRCODE = '55000';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER forecast_points_insert_draft_only AFTER INSERT ON forecast_points
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
--> statement-breakpoint
CREATE TRIGGER forecast_points_update_draft_only AFTER UPDATE ON forecast_points
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
--> statement-breakpoint
CREATE TRIGGER forecast_points_delete_draft_only AFTER DELETE ON forecast_points
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
--> statement-breakpoint
CREATE TRIGGER forecast_adjustments_insert_draft_only AFTER INSERT ON forecast_adjustments
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
--> statement-breakpoint
CREATE TRIGGER forecast_adjustments_update_draft_only AFTER UPDATE ON forecast_adjustments
  REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
--> statement-breakpoint
CREATE TRIGGER forecast_adjustments_delete_draft_only AFTER DELETE ON forecast_adjustments
  REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION forecast_version_children_guard();
