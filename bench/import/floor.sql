-- The schema floor for bench/import/run: the rows `twinprobe import pairs`
-- stores for the file (vacancies, strata, probes, sendings, responses, with
-- every index of the real schema), written by SQLite itself from the bare
-- table that `.import` filled, as five INSERT ... SELECT statements. No CSV
-- checking, no audit sealing: what the store's layout costs on its own.
-- Run on an empty store (the real schema) with the bare table attached as b.
PRAGMA foreign_keys = ON;
PRAGMA journal_mode = WAL;
PRAGMA synchronous = NORMAL;
PRAGMA cache_size = -32768;
BEGIN IMMEDIATE;
INSERT INTO plan(id, origin, kind, created_at, audit_seq) VALUES (1, 'import', 'paired', '2027-01-01T00:00:00Z', 1);
INSERT INTO arm(id, plan_id, label, is_reference, audit_seq) VALUES (1, 1, 'inland', 1, 1), (2, 1, 'coastal', 0, 1);
CREATE TEMP TABLE v AS
  SELECT vacancy, min(rowid) AS first_row, min(occupation) AS occupation, min(region) AS region
  FROM b.t GROUP BY vacancy;
INSERT INTO vacancy(plan_id, ref, source, audit_seq) SELECT 1, vacancy, 'import', 1 FROM temp.v ORDER BY first_row;
INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq)
  SELECT x.id, 'occupation', v.occupation, 1 FROM vacancy x JOIN temp.v v ON v.vacancy = x.ref ORDER BY x.id;
INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq)
  SELECT x.id, 'region', v.region, 1 FROM vacancy x JOIN temp.v v ON v.vacancy = x.ref ORDER BY x.id;
INSERT INTO probe(id, plan_id, ref, vacancy_id, arm_id, send_order, audit_seq)
  SELECT t.rowid, 1, printf('P%05d', t.rowid), x.id, CASE t.arm WHEN 'inland' THEN 1 ELSE 2 END, 1, 1
  FROM b.t t JOIN vacancy x ON x.ref = t.vacancy ORDER BY t.rowid;
INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq)
  SELECT rowid, sent_at, 'bench', '2027-01-01T00:00:00Z', 1 FROM b.t WHERE sent_at <> '' ORDER BY rowid;
INSERT INTO response(probe_id, code, received_at, origin, flags, entered_by, entered_at, audit_seq)
  SELECT rowid, outcome, nullif(responded_at, ''), 'import', '', 'bench', '2027-01-01T00:00:00Z', 1
  FROM b.t ORDER BY rowid;
COMMIT;
