-- Published releases are immutable: only the withdrawal (tombstone) columns
-- and the bundle key may change after insert, and nothing may be deleted.
CREATE OR REPLACE FUNCTION cohesia_release_guard() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'release % is published and cannot be deleted', OLD.id USING ERRCODE = 'restrict_violation';
  END IF;
  IF (NEW.id, NEW.dataset_id, NEW.version, NEW.suffix, NEW.doi, NEW.published_at, NEW.published_by, NEW.title,
      NEW.metadata, NEW.statistics, NEW.licence, NEW.access_level, NEW.embargo_until, NEW.changelog)
     IS DISTINCT FROM
     (OLD.id, OLD.dataset_id, OLD.version, OLD.suffix, OLD.doi, OLD.published_at, OLD.published_by, OLD.title,
      OLD.metadata, OLD.statistics, OLD.licence, OLD.access_level, OLD.embargo_until, OLD.changelog) THEN
    RAISE EXCEPTION 'release % is published and its content cannot change', OLD.id USING ERRCODE = 'restrict_violation';
  END IF;
  IF OLD.bundle_key IS NOT NULL AND NEW.bundle_key IS DISTINCT FROM OLD.bundle_key THEN
    RAISE EXCEPTION 'the bundle of release % is already recorded', OLD.id USING ERRCODE = 'restrict_violation';
  END IF;
  IF OLD.withdrawn_at IS NOT NULL AND (NEW.withdrawn_at, NEW.withdrawn_reason, NEW.withdrawn_by) IS DISTINCT FROM (OLD.withdrawn_at, OLD.withdrawn_reason, OLD.withdrawn_by) THEN
    RAISE EXCEPTION 'release % is already withdrawn', OLD.id USING ERRCODE = 'restrict_violation';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER release_immutable BEFORE UPDATE OR DELETE ON "release"
  FOR EACH ROW EXECUTE FUNCTION cohesia_release_guard();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cohesia_release_file_guard() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'files of a published release cannot change' USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER release_file_immutable BEFORE UPDATE OR DELETE ON "release_file"
  FOR EACH ROW EXECUTE FUNCTION cohesia_release_file_guard();
