-- Asset codes become unique in a project whatever their case (next migration). Assets already in
-- a register whose codes differ only in case would make that index fail with a bare "duplicate
-- key" message. Which of two such assets is the right one, or whether they are one asset entered
-- twice, is for the project's people to say: this migration renames and removes nothing. It stops
-- (and with it every pending migration, which run in one transaction) naming each clash, so that
-- one asset of each pair can be renamed or removed in the register before migrating again.
DO $$
DECLARE
  clashes text;
BEGIN
  SELECT string_agg(format('project %s: %s', p.code, c.codes), '; ' ORDER BY p.code, c.codes)
    INTO clashes
    FROM (
      SELECT a.project_id, string_agg(format('%s (asset %s)', a.code, a.id), ', ' ORDER BY a.code, a.id) AS codes
        FROM assets a
        WHERE a.removed_at IS NULL
        GROUP BY a.project_id, lower(a.code)
        HAVING count(*) > 1
    ) c
    JOIN projects p ON p.id = c.project_id;
  IF clashes IS NOT NULL THEN
    RAISE EXCEPTION 'Asset codes that differ only in case: %. Rename or remove one asset of each group in the register, then migrate again.', clashes;
  END IF;
END $$;
