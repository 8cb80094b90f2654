-- An evaluation's chart data also stored gzipped: the charts route sends these bytes as they are
-- (Content-Encoding: gzip) instead of compressing the JSON on every request. Filled with each new
-- evaluation and, for the ones stored before, on their first read.
ALTER TABLE "evaluations" ADD COLUMN "charts_gzip" bytea;--> statement-breakpoint
-- The chart data are a cache derived from the stored analysis and result: either form may be filled in
-- once while it is null. Nothing else of an evaluation changes (0007).
CREATE OR REPLACE FUNCTION evaluation_immutable() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'UPDATE'
    AND (OLD.charts IS NULL OR OLD.charts_gzip IS NULL)
    AND (to_jsonb(NEW) - 'charts' - 'charts_gzip') = (to_jsonb(OLD) - 'charts' - 'charts_gzip')
    AND (OLD.charts IS NULL OR (to_jsonb(NEW) -> 'charts') = (to_jsonb(OLD) -> 'charts'))
    AND (OLD.charts_gzip IS NULL OR NEW.charts_gzip IS NOT DISTINCT FROM OLD.charts_gzip) THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION '% of % refused: stored % are immutable; insert a new one instead', TG_OP, TG_TABLE_NAME, TG_TABLE_NAME
    USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
