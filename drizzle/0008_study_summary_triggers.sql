-- Keeps study_summaries current on every write to revisions, checklist items and remarks
-- (a custom migration: drizzle-kit does not model functions or triggers). One function
-- recomputes a study's row from scratch; statement-level triggers call it once per study a
-- statement touched, so recalculating a revision (delete and insert ~50 checklist rows)
-- costs one refresh, not a hundred.
CREATE FUNCTION refresh_study_summary(target uuid) RETURNS void LANGUAGE sql AS $$
  INSERT INTO study_summaries AS s (study_id, project_id, revision_id, revision_number, state, updated_at, worst_margin_pct, open_remarks)
  SELECT st.id, st.project_id, r.id, r.number, r.state, r.updated_at,
    (SELECT min(c.margin_pct) FROM checklist_items c WHERE c.revision_id = r.id AND c.kind = 'computed'),
    (SELECT count(*)::int FROM remarks m WHERE m.revision_id = r.id AND NOT m.resolved)
  FROM studies st
  JOIN LATERAL (SELECT * FROM revisions x WHERE x.study_id = st.id ORDER BY x.number DESC LIMIT 1) r ON true
  WHERE st.id = target
  ON CONFLICT (study_id) DO UPDATE SET
    revision_id = excluded.revision_id, revision_number = excluded.revision_number, state = excluded.state,
    updated_at = excluded.updated_at, worst_margin_pct = excluded.worst_margin_pct, open_remarks = excluded.open_remarks;
$$;
--> statement-breakpoint
CREATE FUNCTION refresh_summaries_of_revisions() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_study_summary(study_id) FROM (SELECT DISTINCT study_id FROM changed) t;
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE FUNCTION refresh_summaries_of_revision_rows() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_study_summary(r.study_id) FROM revisions r WHERE r.id IN (SELECT DISTINCT revision_id FROM changed);
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER revisions_summary_ins AFTER INSERT ON revisions REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revisions();
--> statement-breakpoint
CREATE TRIGGER revisions_summary_upd AFTER UPDATE ON revisions REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revisions();
--> statement-breakpoint
CREATE TRIGGER checklist_summary_ins AFTER INSERT ON checklist_items REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
CREATE TRIGGER checklist_summary_upd AFTER UPDATE ON checklist_items REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
CREATE TRIGGER checklist_summary_del AFTER DELETE ON checklist_items REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
CREATE TRIGGER remarks_summary_ins AFTER INSERT ON remarks REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
CREATE TRIGGER remarks_summary_upd AFTER UPDATE ON remarks REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
CREATE TRIGGER remarks_summary_del AFTER DELETE ON remarks REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION refresh_summaries_of_revision_rows();
--> statement-breakpoint
-- Indexes for the studies table's sorts and the per-revision reads that had none.
CREATE INDEX studies_project_title_idx ON studies (project_id, title, id);
--> statement-breakpoint
CREATE INDEX remarks_revision_idx ON remarks (revision_id);
--> statement-breakpoint
CREATE INDEX check_values_revision_idx ON check_values (revision_id);
--> statement-breakpoint
CREATE INDEX revision_files_revision_idx ON revision_files (revision_id);
--> statement-breakpoint
SELECT refresh_study_summary(id) FROM studies;
