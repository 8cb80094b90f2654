-- A limit-set revision is immutable: an edit always inserts a new revision. This guards the
-- rule below the application, so an evaluation always finds the revision it was judged against.
CREATE FUNCTION limit_set_revisions_immutable() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'limit-set revisions are immutable; insert a new revision instead';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER limit_set_revisions_no_update
  BEFORE UPDATE ON limit_set_revisions
  FOR EACH ROW EXECUTE FUNCTION limit_set_revisions_immutable();
