-- Nothing that was judged or signed can change underneath: a stored limit-set revision and a stored
-- evaluation are never updated or deleted (an edit inserts a new revision; a re-judgement inserts a new
-- evaluation). 0002 refused UPDATE of a revision; this also refuses DELETE and TRUNCATE of revisions and
-- UPDATE, DELETE and TRUNCATE of evaluations, below the application.
CREATE FUNCTION stored_record_immutable() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION '% of % refused: stored % are immutable; insert a new one instead', TG_OP, TG_TABLE_NAME, TG_TABLE_NAME
    USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
-- An evaluation's chart series are a cache derived from its stored analysis and result: one stored
-- before they were precomputed may have them filled in once. Nothing else of an evaluation changes.
CREATE FUNCTION evaluation_immutable() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'UPDATE' AND OLD.charts IS NULL AND (to_jsonb(NEW) - 'charts') = (to_jsonb(OLD) - 'charts') THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION '% of % refused: stored % are immutable; insert a new one instead', TG_OP, TG_TABLE_NAME, TG_TABLE_NAME
    USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER limit_set_revisions_no_delete
  BEFORE DELETE ON limit_set_revisions
  FOR EACH ROW EXECUTE FUNCTION stored_record_immutable();
--> statement-breakpoint
CREATE TRIGGER limit_set_revisions_no_truncate
  BEFORE TRUNCATE ON limit_set_revisions
  FOR EACH STATEMENT EXECUTE FUNCTION stored_record_immutable();
--> statement-breakpoint
CREATE TRIGGER evaluations_no_update_or_delete
  BEFORE UPDATE OR DELETE ON evaluations
  FOR EACH ROW EXECUTE FUNCTION evaluation_immutable();
--> statement-breakpoint
CREATE TRIGGER evaluations_no_truncate
  BEFORE TRUNCATE ON evaluations
  FOR EACH STATEMENT EXECUTE FUNCTION stored_record_immutable();
