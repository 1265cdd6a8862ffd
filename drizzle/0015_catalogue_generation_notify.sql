-- The bump also announces the new generation (delivered at commit), so a process that owns an embedded
-- database can keep it in memory instead of reading it on every request.
CREATE OR REPLACE FUNCTION cohesia_bump_catalogue_generation() RETURNS trigger AS $$
DECLARE
  v integer;
BEGIN
  UPDATE catalogue_generation SET value = value + 1 WHERE id = 1 RETURNING value INTO v;
  PERFORM pg_notify('cohesia_catalogue', v::text);
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
