-- The summary row carries the study's code, title and kind, so the studies list reads one table
-- (a custom migration: drizzle-kit does not model functions or triggers). The function now copies
-- them; a trigger on studies keeps them current when a study is renamed.
CREATE OR REPLACE FUNCTION refresh_study_summary(target uuid) RETURNS void LANGUAGE sql AS $$
  INSERT INTO study_summaries AS s (study_id, project_id, code, title, kind, revision_id, revision_number, state, updated_at, worst_margin_pct, open_remarks)
  SELECT st.id, st.project_id, st.code, st.title, st.kind, r.id, r.number, r.state, r.updated_at,
    (SELECT min(c.margin_pct) FROM checklist_items c WHERE c.revision_id = r.id AND c.kind = 'computed'),
    (SELECT count(*)::int FROM remarks m WHERE m.revision_id = r.id AND NOT m.resolved)
  FROM studies st
  JOIN LATERAL (SELECT * FROM revisions x WHERE x.study_id = st.id ORDER BY x.number DESC LIMIT 1) r ON true
  WHERE st.id = target
  ON CONFLICT (study_id) DO UPDATE SET
    project_id = excluded.project_id, code = excluded.code, title = excluded.title, kind = excluded.kind,
    revision_id = excluded.revision_id, revision_number = excluded.revision_number, state = excluded.state,
    updated_at = excluded.updated_at, worst_margin_pct = excluded.worst_margin_pct, open_remarks = excluded.open_remarks;
$$;
--> statement-breakpoint
CREATE FUNCTION refresh_summaries_of_studies() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_study_summary(id) FROM changed;
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER studies_summary_upd AFTER UPDATE ON studies REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_studies();
--> statement-breakpoint
SELECT refresh_study_summary(id) FROM studies;
