CREATE TABLE "catalogue_generation" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"value" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
INSERT INTO "catalogue_generation" ("id", "value") VALUES (1, 0);
--> statement-breakpoint
CREATE OR REPLACE FUNCTION cohesia_bump_catalogue_generation() RETURNS trigger AS $$
BEGIN
  UPDATE catalogue_generation SET value = value + 1 WHERE id = 1;
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER catalogue_generation_on_publish AFTER INSERT ON "release"
  FOR EACH STATEMENT EXECUTE FUNCTION cohesia_bump_catalogue_generation();
--> statement-breakpoint
-- The only updates a release allows: its withdrawal and its bundle key, once.
CREATE TRIGGER catalogue_generation_on_release_update AFTER UPDATE ON "release"
  FOR EACH STATEMENT EXECUTE FUNCTION cohesia_bump_catalogue_generation();
--> statement-breakpoint
CREATE TRIGGER catalogue_generation_on_lab AFTER UPDATE OF name, slug, is_demo ON "organization"
  FOR EACH STATEMENT EXECUTE FUNCTION cohesia_bump_catalogue_generation();
