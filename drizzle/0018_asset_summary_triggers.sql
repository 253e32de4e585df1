-- Keeps asset_summaries current on every write to what the register shows of an asset (a custom
-- migration: drizzle-kit does not model functions or triggers). One function recomputes the rows
-- of a set of assets from scratch; statement-level triggers call it once per statement with the
-- assets that statement touched, so a bulk write (a new obligation type owed by thousands of
-- assets, a revision issued that covers them) costs one set-based refresh. Whatever writes (a
-- service, a seed script, SQL by hand) cannot leave the register behind, and the refresh is part
-- of the writer's transaction.
CREATE FUNCTION refresh_asset_summaries(targets uuid[]) RETURNS void LANGUAGE plpgsql AS $$
BEGIN
  IF targets IS NULL OR cardinality(targets) = 0 THEN RETURN; END IF;
  -- Wait for another transaction refreshing the same rows to commit, in a fixed order, before
  -- reading: each statement below then takes a fresh snapshot (READ COMMITTED) that holds its
  -- writes, so two writers to one asset cannot leave a summary that misses the first's change.
  PERFORM 1 FROM asset_summaries WHERE asset_id = ANY(targets) ORDER BY asset_id FOR UPDATE;
  DELETE FROM asset_summaries s WHERE s.asset_id = ANY(targets)
    AND NOT EXISTS (SELECT 1 FROM assets a WHERE a.id = s.asset_id AND a.removed_at IS NULL);
  INSERT INTO asset_summaries AS s (asset_id, project_id, kind, code, name, issued, issued_count, worst_margin_pct, open_remarks, open_reviews, obligations_done, due_dates, next_due_on, standing)
  SELECT a.id, a.project_id, a.kind, a.code, a.name,
    coalesce(iss.issued, ''), coalesce(iss.issued_count, 0), iss.worst_margin_pct,
    coalesce(rem.open_remarks, 0), coalesce(rev.open_reviews, 0),
    coalesce(ob.done, 0), coalesce(ob.due_dates, '{}'::date[]), ob.next_due_on,
    CASE WHEN coalesce(iss.issued_count, 0) = 0 THEN 0 WHEN coalesce(rev.open_reviews, 0) > 0 THEN 1 ELSE 2 END
  FROM assets a
  LEFT JOIN LATERAL (
    SELECT count(*)::int AS issued_count, string_agg(st.code || ' rev ' || rv.number, ', ' ORDER BY st.code) AS issued, min(m.worst)::float8 AS worst_margin_pct
    FROM study_assets sa
    JOIN studies st ON st.id = sa.study_id
    JOIN revisions rv ON rv.study_id = st.id AND rv.state = 'issued'
    LEFT JOIN LATERAL (SELECT min(ci.margin_pct) AS worst FROM checklist_items ci WHERE ci.revision_id = rv.id AND ci.kind = 'computed') m ON true
    WHERE sa.asset_id = a.id
  ) iss ON true
  LEFT JOIN LATERAL (
    SELECT sum(ss.open_remarks)::int AS open_remarks FROM study_assets sa JOIN study_summaries ss ON ss.study_id = sa.study_id WHERE sa.asset_id = a.id
  ) rem ON true
  LEFT JOIN LATERAL (
    SELECT count(*)::int AS open_reviews
    FROM study_assets sa JOIN study_reviews sr ON sr.study_id = sa.study_id JOIN revisions rv ON rv.id = sr.revision_id AND rv.state = 'issued'
    WHERE sa.asset_id = a.id
  ) rev ON true
  LEFT JOIN LATERAL (
    SELECT count(*) FILTER (WHERE ao.last_done_on IS NOT NULL)::int AS done,
      array_agg(ao.next_due_on ORDER BY ao.next_due_on) FILTER (WHERE ao.next_due_on IS NOT NULL) AS due_dates,
      min(ao.next_due_on) AS next_due_on
    FROM asset_obligations ao WHERE ao.asset_id = a.id
  ) ob ON true
  WHERE a.id = ANY(targets) AND a.removed_at IS NULL
  ON CONFLICT (asset_id) DO UPDATE SET
    project_id = excluded.project_id, kind = excluded.kind, code = excluded.code, name = excluded.name,
    issued = excluded.issued, issued_count = excluded.issued_count, worst_margin_pct = excluded.worst_margin_pct,
    open_remarks = excluded.open_remarks, open_reviews = excluded.open_reviews, obligations_done = excluded.obligations_done,
    due_dates = excluded.due_dates, next_due_on = excluded.next_due_on, standing = excluded.standing;
END $$;
--> statement-breakpoint
-- The assets linked to any of a set of studies.
CREATE FUNCTION refresh_asset_summaries_of_studies(study_ids uuid[]) RETURNS void LANGUAGE sql AS $$
  SELECT refresh_asset_summaries(array_agg(DISTINCT sa.asset_id)) FROM study_assets sa WHERE sa.study_id = ANY(study_ids);
$$;
--> statement-breakpoint
-- Rows that carry an asset_id (assets by id, study links, obligation standing).
CREATE FUNCTION asset_summaries_by_asset_id() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_TABLE_NAME = 'assets' THEN
    PERFORM refresh_asset_summaries(array_agg(DISTINCT id)) FROM changed;
  ELSE
    PERFORM refresh_asset_summaries(array_agg(DISTINCT asset_id)) FROM changed;
  END IF;
  RETURN NULL;
END $$;
--> statement-breakpoint
-- Rows that carry a study_id (open reviews, or revisions inserted already issued).
CREATE FUNCTION asset_summaries_by_study_id() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_TABLE_NAME = 'revisions' THEN
    PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT study_id)) FROM changed WHERE state = 'issued';
  ELSE
    PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT study_id)) FROM changed;
  END IF;
  RETURN NULL;
END $$;
--> statement-breakpoint
-- Revision updates: only a change of state (issue, supersede, withdrawal) changes what the
-- register shows; an ordinary inputs save leaves the assets alone.
CREATE FUNCTION asset_summaries_of_revision_states() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT n.study_id))
  FROM new_rows n JOIN old_rows o ON o.id = n.id WHERE o.state IS DISTINCT FROM n.state;
  RETURN NULL;
END $$;
--> statement-breakpoint
-- Checklist items: only those of issued revisions give the register its worst margin.
CREATE FUNCTION asset_summaries_of_checklist() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT r.study_id))
  FROM revisions r WHERE r.state = 'issued' AND r.id IN (SELECT revision_id FROM changed);
  RETURN NULL;
END $$;
--> statement-breakpoint
-- Study summaries (kept by their own triggers from remarks): a changed count of open remarks.
CREATE FUNCTION asset_summaries_of_study_summaries() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT study_id)) FROM new_rows;
  ELSE
    PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT n.study_id))
    FROM new_rows n JOIN old_rows o ON o.study_id = n.study_id WHERE o.open_remarks IS DISTINCT FROM n.open_remarks;
  END IF;
  RETURN NULL;
END $$;
--> statement-breakpoint
-- Studies: the code shown in "B01 rev 2".
CREATE FUNCTION asset_summaries_of_study_codes() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM refresh_asset_summaries_of_studies(array_agg(DISTINCT n.id))
  FROM new_rows n JOIN old_rows o ON o.id = n.id WHERE o.code IS DISTINCT FROM n.code;
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER assets_asset_summary_ins AFTER INSERT ON assets REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER assets_asset_summary_upd AFTER UPDATE ON assets REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER study_assets_asset_summary_ins AFTER INSERT ON study_assets REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER study_assets_asset_summary_upd AFTER UPDATE ON study_assets REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER study_assets_asset_summary_del AFTER DELETE ON study_assets REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER asset_obligations_asset_summary_ins AFTER INSERT ON asset_obligations REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER asset_obligations_asset_summary_upd AFTER UPDATE ON asset_obligations REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER asset_obligations_asset_summary_del AFTER DELETE ON asset_obligations REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_asset_id();
--> statement-breakpoint
CREATE TRIGGER revisions_asset_summary_ins AFTER INSERT ON revisions REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_study_id();
--> statement-breakpoint
CREATE TRIGGER revisions_asset_summary_upd AFTER UPDATE ON revisions REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_revision_states();
--> statement-breakpoint
CREATE TRIGGER checklist_asset_summary_ins AFTER INSERT ON checklist_items REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_checklist();
--> statement-breakpoint
CREATE TRIGGER checklist_asset_summary_upd AFTER UPDATE ON checklist_items REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_checklist();
--> statement-breakpoint
CREATE TRIGGER checklist_asset_summary_del AFTER DELETE ON checklist_items REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_checklist();
--> statement-breakpoint
CREATE TRIGGER study_summaries_asset_summary_ins AFTER INSERT ON study_summaries REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_study_summaries();
--> statement-breakpoint
CREATE TRIGGER study_summaries_asset_summary_upd AFTER UPDATE ON study_summaries REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_study_summaries();
--> statement-breakpoint
CREATE TRIGGER study_reviews_asset_summary_ins AFTER INSERT ON study_reviews REFERENCING NEW TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_study_id();
--> statement-breakpoint
CREATE TRIGGER study_reviews_asset_summary_del AFTER DELETE ON study_reviews REFERENCING OLD TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_by_study_id();
--> statement-breakpoint
CREATE TRIGGER studies_asset_summary_upd AFTER UPDATE ON studies REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION asset_summaries_of_study_codes();
--> statement-breakpoint
SELECT refresh_asset_summaries(array_agg(id)) FROM assets;
