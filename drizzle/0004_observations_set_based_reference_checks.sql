ALTER TABLE "observation_revisions" DROP CONSTRAINT "observation_revisions_series_id_series_id_fk";
--> statement-breakpoint
ALTER TABLE "observation_revisions" DROP CONSTRAINT "observation_revisions_upload_id_uploads_id_fk";
--> statement-breakpoint
ALTER TABLE "observation_revisions" DROP CONSTRAINT "observation_revisions_superseded_by_upload_id_uploads_id_fk";
--> statement-breakpoint
ALTER TABLE "observations" DROP CONSTRAINT "observations_series_id_series_id_fk";
--> statement-breakpoint
ALTER TABLE "observations" DROP CONSTRAINT "observations_upload_id_uploads_id_fk";
--> statement-breakpoint
-- Row-level foreign keys on observations cost a lookup and a row lock per reading, which cut bulk
-- loading to about a quarter (docs/observations-store.md). These statement-level triggers check the
-- same references once per statement: the distinct series and uploads a batch refers to must exist,
-- and they are locked FOR KEY SHARE as a foreign key would, so they cannot vanish under the batch.
CREATE FUNCTION observations_references_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  wanted bigint;
  present bigint;
BEGIN
  SELECT count(DISTINCT series_id) INTO wanted FROM new_rows;
  PERFORM 1 FROM series WHERE id IN (SELECT DISTINCT series_id FROM new_rows) FOR KEY SHARE;
  GET DIAGNOSTICS present = ROW_COUNT;
  IF present < wanted THEN
    RAISE EXCEPTION 'insert or update on table "%" refers to a series that does not exist', TG_TABLE_NAME
      USING ERRCODE = '23503';
  END IF;
  SELECT count(DISTINCT upload_id) INTO wanted FROM new_rows WHERE upload_id IS NOT NULL;
  IF wanted > 0 THEN
    PERFORM 1 FROM uploads WHERE id IN (SELECT DISTINCT upload_id FROM new_rows) FOR KEY SHARE;
    GET DIAGNOSTICS present = ROW_COUNT;
    IF present < wanted THEN
      RAISE EXCEPTION 'insert or update on table "%" refers to an upload that does not exist', TG_TABLE_NAME
        USING ERRCODE = '23503';
    END IF;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER observations_insert_references AFTER INSERT ON observations
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION observations_references_guard();
--> statement-breakpoint
CREATE TRIGGER observations_update_references AFTER UPDATE ON observations
  REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION observations_references_guard();
--> statement-breakpoint
-- ON DELETE CASCADE, once per statement: a deleted series takes its readings and their history.
CREATE FUNCTION series_delete_readings() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM observations o USING deleted_series d WHERE o.series_id = d.id;
  DELETE FROM observation_revisions r USING deleted_series d WHERE r.series_id = d.id;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER series_delete_readings AFTER DELETE ON series
  REFERENCING OLD TABLE AS deleted_series FOR EACH STATEMENT EXECUTE FUNCTION series_delete_readings();
--> statement-breakpoint
-- ON DELETE RESTRICT without an index on observations.upload_id: an upload that is importing or
-- done may have landed readings, so it cannot be deleted (a failed upload landed none).
CREATE FUNCTION uploads_keep_landed() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  landed integer;
BEGIN
  SELECT id INTO landed FROM deleted_uploads WHERE status IN ('importing', 'done') LIMIT 1;
  IF landed IS NOT NULL THEN
    RAISE EXCEPTION 'upload % has landed readings and cannot be deleted', landed USING ERRCODE = '23503';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER uploads_keep_landed AFTER DELETE ON uploads
  REFERENCING OLD TABLE AS deleted_uploads FOR EACH STATEMENT EXECUTE FUNCTION uploads_keep_landed();
