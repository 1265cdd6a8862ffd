-- The catalogue's search rows follow the releases through triggers, so every
-- path that writes a release (publishing, demo seed, restore) indexes it in
-- the same transaction. 'english' stems title, keywords and description;
-- PGlite and PostgreSQL 15 both ship it.
CREATE OR REPLACE FUNCTION cohesia_search_refresh_dataset(p_dataset text) RETURNS void AS $$
DECLARE
  v_latest text;
  v_count int;
  v_downloads int;
BEGIN
  SELECT r.id INTO v_latest FROM release r WHERE r.dataset_id = p_dataset AND r.withdrawn_at IS NULL ORDER BY r.version DESC LIMIT 1;
  SELECT count(*)::int INTO v_count FROM release r WHERE r.dataset_id = p_dataset AND r.withdrawn_at IS NULL;
  SELECT count(DISTINCT (e.release_id, e.visitor_key, coalesce(e.file_name, ''), date_trunc('day', e.created_at)))::int INTO v_downloads
    FROM download_event e JOIN release r ON r.id = e.release_id WHERE r.dataset_id = p_dataset;
  UPDATE release_search s
     SET listed = (s.release_id IS NOT DISTINCT FROM v_latest), version_count = greatest(v_count, 1), downloads = v_downloads
   WHERE s.dataset_id = p_dataset;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cohesia_search_index_release(p_release text) RETURNS void AS $$
BEGIN
  INSERT INTO release_search (release_id, dataset_id, lab_id, lab_name, listed, withdrawn, version_count, published_at, title, description,
                              group_type, species, setting, dimension, individuals, frame_rate, licence, access_level, publication_year, downloads, document)
  SELECT r.id, r.dataset_id, d.lab_id, coalesce(o.name, ''), false, r.withdrawn_at IS NOT NULL, 1, r.published_at, r.title,
         coalesce(r.metadata->>'description', ''),
         r.metadata->>'groupType',
         coalesce(array(SELECT jsonb_path_query(r.metadata, '$.species[*].name') #>> '{}'), '{}'),
         r.metadata->>'setting',
         CASE WHEN jsonb_typeof(r.metadata->'dimension') = 'number' THEN (r.metadata->>'dimension')::int END,
         coalesce(
           CASE WHEN jsonb_typeof(r.metadata->'numberOfIndividuals') = 'number' THEN (r.metadata->>'numberOfIndividuals')::numeric::int END,
           (SELECT max((v->>'tracks')::numeric)::int FROM jsonb_each(r.statistics) AS e(k, v) WHERE jsonb_typeof(v) = 'object' AND jsonb_typeof(v->'tracks') = 'number')),
         CASE WHEN jsonb_typeof(r.metadata->'frameRate') = 'number' THEN (r.metadata->>'frameRate')::real END,
         r.licence, r.access_level, extract(year FROM r.published_at AT TIME ZONE 'UTC')::int, 0,
         setweight(to_tsvector('english', r.title), 'A')
         || setweight(to_tsvector('english', array_to_string(array(SELECT jsonb_path_query(r.metadata, '$.keywords[*]') #>> '{}'), ' ')
              || ' ' || array_to_string(array(SELECT jsonb_path_query(r.metadata, '$.species[*].name') #>> '{}'), ' ')
              || ' ' || array_to_string(array(SELECT jsonb_path_query(r.metadata, '$.species[*].commonName') #>> '{}'), ' ')
              || ' ' || coalesce(r.metadata->>'groupType', '')), 'B')
         || setweight(to_tsvector('english', array_to_string(array(SELECT jsonb_path_query(r.metadata, '$.creators[*].name') #>> '{}'), ' ')
              || ' ' || coalesce(o.name, '')), 'C')
         || setweight(to_tsvector('english', coalesce(r.metadata->>'description', '')), 'D')
    FROM release r JOIN dataset d ON d.id = r.dataset_id LEFT JOIN organization o ON o.id = d.lab_id
   WHERE r.id = p_release
  ON CONFLICT (release_id) DO NOTHING;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cohesia_search_on_release() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    PERFORM cohesia_search_index_release(NEW.id);
  ELSE
    UPDATE release_search SET withdrawn = NEW.withdrawn_at IS NOT NULL WHERE release_id = NEW.id;
  END IF;
  PERFORM cohesia_search_refresh_dataset(NEW.dataset_id);
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER release_search_on_insert AFTER INSERT ON "release"
  FOR EACH ROW EXECUTE FUNCTION cohesia_search_on_release();
--> statement-breakpoint
CREATE TRIGGER release_search_on_withdraw AFTER UPDATE OF withdrawn_at ON "release"
  FOR EACH ROW WHEN (OLD.withdrawn_at IS DISTINCT FROM NEW.withdrawn_at) EXECUTE FUNCTION cohesia_search_on_release();
--> statement-breakpoint
-- A maintained counter keeps "most downloaded" an index scan: +1 only for the first event of a visitor, item and day.
CREATE OR REPLACE FUNCTION cohesia_search_on_download() RETURNS trigger AS $$
BEGIN
  IF NOT EXISTS (
    SELECT 1 FROM download_event e
     WHERE e.release_id = NEW.release_id AND e.id <> NEW.id
       AND e.visitor_key IS NOT DISTINCT FROM NEW.visitor_key
       AND coalesce(e.file_name, '') = coalesce(NEW.file_name, '')
       AND date_trunc('day', e.created_at) = date_trunc('day', NEW.created_at)) THEN
    UPDATE release_search s SET downloads = s.downloads + 1
     WHERE s.dataset_id = (SELECT r.dataset_id FROM release r WHERE r.id = NEW.release_id);
  END IF;
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER release_search_on_download AFTER INSERT ON "download_event"
  FOR EACH ROW EXECUTE FUNCTION cohesia_search_on_download();
--> statement-breakpoint
-- Backfill the releases published before this migration.
SELECT cohesia_search_index_release(id) FROM release ORDER BY published_at;
--> statement-breakpoint
SELECT cohesia_search_refresh_dataset(id) FROM dataset;
