#include "core/office_records.h"

#include <algorithm>
#include <set>

namespace twinprobe {
namespace {

// JSON array of ids, read in SQL through json_each (one bound value instead
// of a statement per id).
std::string IdArray(const std::vector<int64_t>& ids) {
  std::string out = "[";
  for (size_t i = 0; i < ids.size(); ++i) out += (i ? "," : "") + std::to_string(ids[i]);
  return out + "]";
}

std::vector<std::string> TableColumns(Store& store, const std::string& schema, const std::string& table) {
  Stmt q = store.Prepare("SELECT name FROM pragma_table_info(?1, ?2) ORDER BY cid");
  q.Bind(1, table).Bind(2, schema);
  std::vector<std::string> cols;
  while (q.Step()) cols.push_back(q.Text(0));
  return cols;
}

// The columns of `table` both stores have, in the target's order: a column
// one side's newer migration added is left to its default.
std::vector<std::string> SharedColumns(Store& store, const std::string& from, const std::string& table) {
  std::vector<std::string> target = TableColumns(store, "main", table), source = TableColumns(store, from, table);
  std::vector<std::string> out;
  for (const std::string& c : target)
    if (std::find(source.begin(), source.end(), c) != source.end()) out.push_back(c);
  return out;
}

std::string Quote(const std::string& name) { return "\"" + name + "\""; }

// INSERT INTO main.T(shared columns) SELECT … FROM FROM.T t WHERE `where`,
// with audit_seq set to ?1 and each column of `replaced` (in order) to ?2, ?3 …
// `keep_id` false leaves `id` out (the target numbers the row).
std::string CopySql(Store& store, const std::string& from, const std::string& table, const std::string& where,
                    bool keep_id, const std::vector<std::string>& replaced = {}, const char* verb = "INSERT") {
  std::string cols, values;
  for (const std::string& c : SharedColumns(store, from, table)) {
    if (c == "id" && !keep_id) continue;
    std::string value = "t." + Quote(c);
    if (c == "audit_seq") value = "?1";
    for (size_t i = 0; i < replaced.size(); ++i)
      if (replaced[i] == c) value = "?" + std::to_string(i + 2);
    cols += (cols.empty() ? "" : ", ") + Quote(c);
    values += (values.empty() ? "" : ", ") + value;
  }
  return std::string(verb) + " INTO main." + Quote(table) + "(" + cols + ") SELECT " + values + " FROM " + from + "." +
         Quote(table) + " t WHERE " + where + " ORDER BY t.rowid";
}

}  // namespace

AttachedStore::AttachedStore(Store& store, const std::string& path, const std::string& alias)
    : store_(store), alias_(alias) {
  // Read-only (a URI filename; Debian's SQLite is built with SQLITE_USE_URI):
  // then BEGIN IMMEDIATE takes the write lock of the main store only, and
  // the other store is never written through this connection.
  std::string uri = "file:";
  for (unsigned char c : path) {
    if (c == '%' || c == '?' || c == '#' || c < 0x21 || c >= 0x7F) {
      static const char* hex = "0123456789ABCDEF";
      uri += '%';
      uri += hex[c >> 4];
      uri += hex[c & 15];
    } else {
      uri += static_cast<char>(c);
    }
  }
  Stmt q = store_.Prepare("ATTACH DATABASE ?1 AS " + alias_);
  q.Bind(1, uri + "?mode=ro");
  q.Run();
  if (store_.QueryInt("SELECT count(*) FROM " + alias_ + ".sqlite_master WHERE name = 'audit'") == 0) {
    store_.Exec("DETACH DATABASE " + alias_);
    throw StoreError("attaching " + path + " read-only did not open a study store");
  }
}

AttachedStore::~AttachedStore() {
  try {
    store_.Exec("DETACH DATABASE " + alias_);
  } catch (...) {
  }
}

std::optional<PlanIdentity> ReadPlanIdentity(Store& store) {
  Stmt q = store.Prepare(
      "SELECT p.id, a.hash, coalesce((SELECT value FROM meta WHERE key = 'study_id' ORDER BY id DESC LIMIT 1), '') "
      "FROM current_plan p JOIN audit a ON a.seq = p.audit_seq");
  if (!q.Step()) return std::nullopt;
  return PlanIdentity{q.Int(0), q.Text(1), q.Text(2)};
}

std::vector<PlanVacancy> ReadPlanVacancies(Store& store) {
  Stmt q = store.Prepare(
      "SELECT v.id, v.ref, coalesce(h.office, '') FROM vacancy v "
      "LEFT JOIN handout_vacancy hv ON hv.vacancy_id = v.id LEFT JOIN handout h ON h.id = hv.handout_id "
      "WHERE v.plan_id = (SELECT id FROM current_plan) ORDER BY v.id");
  std::vector<PlanVacancy> out;
  while (q.Step()) out.push_back({q.Int(0), q.Text(1), q.Text(2)});
  return out;
}

std::vector<int64_t> VacanciesInStratum(Store& store, const std::string& name, const std::string& value) {
  Stmt q = store.Prepare(
      "SELECT v.id FROM vacancy v JOIN vacancy_stratum s ON s.vacancy_id = v.id "
      "WHERE v.plan_id = (SELECT id FROM current_plan) AND s.name = ?1 AND s.value = ?2 ORDER BY v.id");
  q.Bind(1, name).Bind(2, value);
  std::vector<int64_t> out;
  while (q.Step()) out.push_back(q.Int(0));
  return out;
}

std::vector<std::string> StratumValues(Store& store, const std::string& name) {
  Stmt q = store.Prepare(
      "SELECT DISTINCT s.value FROM vacancy v JOIN vacancy_stratum s ON s.vacancy_id = v.id "
      "WHERE v.plan_id = (SELECT id FROM current_plan) AND s.name = ?1 ORDER BY s.value");
  q.Bind(1, name);
  std::vector<std::string> out;
  while (q.Step()) out.push_back(q.Text(0));
  return out;
}

namespace {
constexpr const char* kHandoutSelect =
    "SELECT h.office, h.folder, h.plan_hash, h.office_head, h.handed_at, h.plan_id, "
    "(SELECT count(*) FROM handout_vacancy v WHERE v.handout_id = h.id), "
    "(SELECT count(*) FROM probe p JOIN handout_vacancy v ON v.vacancy_id = p.vacancy_id "
    "WHERE v.handout_id = h.id AND p.plan_id = h.plan_id) FROM handout h ";

HandoutRecord HandoutFrom(const Stmt& q) {
  HandoutRecord h;
  h.office = q.Text(0);
  h.folder = q.Text(1);
  h.plan_hash = q.Text(2);
  h.office_head = q.Text(3);
  h.handed_at = q.Text(4);
  h.plan_id = q.Int(5);
  h.vacancies = q.Int(6);
  h.probes = q.Int(7);
  return h;
}
}  // namespace

std::vector<HandoutRecord> ReadHandouts(Store& store) {
  Stmt q = store.Prepare(std::string(kHandoutSelect) + "ORDER BY h.id");
  std::vector<HandoutRecord> out;
  while (q.Step()) out.push_back(HandoutFrom(q));
  return out;
}

std::optional<HandoutRecord> FindHandout(Store& store, const std::string& office) {
  Stmt q = store.Prepare(std::string(kHandoutSelect) + "WHERE h.office = ?1");
  q.Bind(1, office);
  if (!q.Step()) return std::nullopt;
  return HandoutFrom(q);
}

void InsertHandout(Store& store, int64_t seq, const HandoutRecord& h, const std::vector<int64_t>& vacancy_ids) {
  Stmt ins = store.Prepare(
      "INSERT INTO handout(office, folder, plan_id, plan_hash, office_head, handed_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)");
  ins.Bind(1, h.office).Bind(2, h.folder).Bind(3, h.plan_id).Bind(4, h.plan_hash).Bind(5, h.office_head);
  ins.Bind(6, h.handed_at).Bind(7, seq).Run();
  const int64_t id = store.LastInsertId();
  Stmt v = store.Prepare(
      "INSERT INTO handout_vacancy(vacancy_id, handout_id, audit_seq) SELECT value, ?2, ?3 FROM json_each(?1)");
  v.Bind(1, IdArray(vacancy_ids)).Bind(2, id).Bind(3, seq).Run();
}

void InsertOfficeOrigin(Store& office, int64_t seq, const OfficeOrigin& o) {
  Stmt ins = office.Prepare(
      "INSERT INTO office_origin(office, study_id, plan_hash, main_head, handed_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, o.office).Bind(2, o.study_id).Bind(3, o.plan_hash).Bind(4, o.main_head).Bind(5, o.handed_at);
  ins.Bind(6, seq).Run();
}

namespace {
std::optional<OfficeOrigin> ReadOrigin(Store& store, const std::string& schema) {
  Stmt q = store.Prepare("SELECT office, study_id, plan_hash, main_head, handed_at FROM " + schema +
                         ".office_origin ORDER BY id LIMIT 1");
  if (!q.Step()) return std::nullopt;
  return OfficeOrigin{q.Text(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4)};
}
}  // namespace

std::optional<OfficeOrigin> ReadOfficeOrigin(Store& store) { return ReadOrigin(store, "main"); }
std::optional<OfficeOrigin> ReadAttachedOrigin(Store& main) { return ReadOrigin(main, "office"); }

int64_t CopyPlanPart(Store& office, int64_t plan_id, const std::vector<int64_t>& vacancy_ids, int64_t seq) {
  const std::string plan = std::to_string(plan_id);
  const std::string ids = IdArray(vacancy_ids);
  const std::string in_ids = "t.vacancy_id IN (SELECT value FROM json_each(?2))";
  const std::string office_probes =
      "(SELECT p.id FROM src.probe p WHERE p.plan_id = " + plan + " AND p.vacancy_id IN (SELECT value FROM json_each(?2)))";
  // In the order of the foreign keys: a row's parent is there before it.
  struct Part {
    std::string table, where;
    bool uses_ids;
  };
  const std::vector<Part> parts = {
      {"plan", "t.id = " + plan, false},
      {"factor", "t.plan_id = " + plan, false},
      {"level", "t.factor_id IN (SELECT id FROM src.factor WHERE plan_id = " + plan + ")", false},
      {"arm", "t.plan_id = " + plan, false},
      {"arm_level", "t.arm_id IN (SELECT id FROM src.arm WHERE plan_id = " + plan + ")", false},
      {"vacancy", "t.id IN (SELECT value FROM json_each(?2))", true},
      {"vacancy_stratum", in_ids, true},
      {"profile", "t.id IN (SELECT profile_id FROM src.probe WHERE id IN " + office_probes + ")", true},
      {"probe", "t.id IN " + office_probes, true},
      {"material_file", "t.plan_id = " + plan + " AND t.probe_id IN " + office_probes, true},
  };
  for (const Part& p : parts) {
    Stmt q = office.Prepare(CopySql(office, "src", p.table, p.where, /*keep_id=*/true));
    q.Bind(1, seq);
    if (p.uses_ids) q.Bind(2, ids);
    q.Run();
  }
  // The study's meta as it stands (the newest value of each key), sealed anew.
  Stmt meta = office.Prepare(
      "INSERT INTO main.meta(key, value, audit_seq) SELECT m.key, m.value, ?1 FROM src.meta m "
      "WHERE m.id = (SELECT max(x.id) FROM src.meta x WHERE x.key = m.key) ORDER BY m.id");
  meta.Bind(1, seq).Run();
  // Employers (not sealed; purge empties them): the office applies to them.
  Stmt employers = office.Prepare(
      "INSERT OR IGNORE INTO main.employer(key, name, contact) SELECT e.key, e.name, e.contact FROM src.employer e "
      "WHERE e.key IN (SELECT employer_key FROM src.vacancy WHERE id IN (SELECT value FROM json_each(?1)))");
  employers.Bind(1, ids).Run();
  return office.QueryInt("SELECT count(*) FROM main.probe");
}

std::vector<MaterialFileName> ReadHandoutMaterialFiles(Store& store, int64_t plan_id,
                                                       const std::vector<int64_t>& vacancy_ids) {
  Stmt q = store.Prepare(
      "SELECT DISTINCT m.folder, m.file FROM material_file m JOIN probe p ON p.id = m.probe_id "
      "WHERE m.plan_id = ?1 AND p.vacancy_id IN (SELECT value FROM json_each(?2)) ORDER BY m.folder, m.file");
  q.Bind(1, plan_id).Bind(2, IdArray(vacancy_ids));
  std::vector<MaterialFileName> out;
  while (q.Step()) out.push_back({q.Text(0), q.Text(1)});
  return out;
}

ChainPoint AttachedHead(Store& main) {
  Stmt q = main.Prepare("SELECT seq, hash, at FROM office.audit ORDER BY seq DESC LIMIT 1");
  if (!q.Step()) return {};
  return {q.Int(0), q.Text(1), q.Text(2)};
}

std::string AttachedEntryHash(Store& main, int64_t seq) {
  Stmt q = main.Prepare("SELECT hash FROM office.audit WHERE seq = ?1");
  q.Bind(1, seq);
  return q.Step() ? q.Text(0) : std::string();
}

bool AttachedPlanIs(Store& main, int64_t plan_id) {
  Stmt q = main.Prepare("SELECT count(*), max(id) FROM office.plan");
  q.Step();
  return q.Int(0) == 1 && q.Int(1) == plan_id;
}

std::vector<ChainPoint> ReadMerges(Store& main, const std::string& office) {
  Stmt q = main.Prepare(
      "SELECT m.office_head_seq, m.office_head, a.at FROM main.office_merge m JOIN main.audit a ON a.seq = m.audit_seq "
      "WHERE m.office = ?1 ORDER BY m.id");
  q.Bind(1, office);
  std::vector<ChainPoint> out;
  while (q.Step()) out.push_back({q.Int(0), q.Text(1), q.Text(2)});
  return out;
}

namespace {

std::vector<PlacedResponse> History(Store& main, const std::string& schema, const std::string& place_sql,
                                   int64_t probe_id) {
  Stmt q = main.Prepare("SELECT r.id, r.code, coalesce(r.received_at, ''), r.entered_by, r.entered_at, " + place_sql +
                        ", NOT EXISTS (SELECT 1 FROM " + schema + ".response s WHERE s.supersedes = r.id) FROM " +
                        schema + ".response r WHERE r.probe_id = ?1 ORDER BY r.id");
  q.Bind(1, probe_id);
  std::vector<PlacedResponse> out;
  while (q.Step()) out.push_back({q.Int(0), q.Text(1), q.Text(2), q.Text(3), q.Text(4), q.Text(5), q.Int(6) != 0});
  return out;
}

std::optional<PlacedResponse> CurrentOf(const std::vector<PlacedResponse>& history) {
  // The newest row nothing supersedes (one per probe while chains stay linear).
  for (auto it = history.rbegin(); it != history.rend(); ++it)
    if (it->current) return *it;
  return std::nullopt;
}

}  // namespace

std::vector<ProbeHistories> ReadOfficeAnswers(Store& main, const std::string& office, int64_t since_seq) {
  Stmt q = main.Prepare(
      "SELECT DISTINCT r.probe_id, p.ref FROM office.response r JOIN office.probe p ON p.id = r.probe_id "
      "WHERE r.audit_seq > ?1 ORDER BY r.probe_id");
  q.Bind(1, since_seq);
  std::vector<ProbeHistories> out;
  while (q.Step()) {
    ProbeHistories h;
    h.probe_id = q.Int(0);
    h.probe_ref = q.Text(1);
    h.main = History(main, "main",
                     "coalesce((SELECT m.office FROM main.merged_row m WHERE m.tbl = 'response' AND m.main_row = r.id), "
                     "'main')",
                     h.probe_id);
    Stmt quoted = main.Prepare("SELECT quote(?1)");
    quoted.Bind(1, office);
    quoted.Step();
    h.office = History(main, "office", quoted.Text(0), h.probe_id);
    h.main_current = CurrentOf(h.main);
    h.office_current = CurrentOf(h.office);
    out.push_back(std::move(h));
  }
  return out;
}

MergedRowCounts MergeOfficeRows(Store& main, const std::string& office, int64_t since_seq, const ChainPoint& head,
                                const std::vector<MergeChoice>& choices, const std::string& actor,
                                const std::string& at, int64_t seq) {
  MergedRowCounts counts;
  Stmt mapped = main.Prepare(
      "INSERT INTO main.merged_row(office, tbl, office_row, main_row, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  auto map_row = [&](const char* table, int64_t office_row, int64_t main_row) {
    mapped.Bind(1, office).Bind(2, table).Bind(3, office_row).Bind(4, main_row).Bind(5, seq).Run();
  };
  auto new_rows = [&](const std::string& table) {
    Stmt q = main.Prepare("SELECT id FROM office." + Quote(table) + " WHERE audit_seq > ?1 ORDER BY id");
    q.Bind(1, since_seq);
    std::vector<int64_t> ids;
    while (q.Step()) ids.push_back(q.Int(0));
    return ids;
  };

  // Sendings and declines name only their probe, the same row in both stores.
  for (const char* table : {"sending", "decline"}) {
    Stmt copy = main.Prepare(CopySql(main, "office", table, "t.id = ?2", /*keep_id=*/false));
    for (int64_t id : new_rows(table)) {
      copy.Bind(1, seq).Bind(2, id).Run();
      map_row(table, id, main.LastInsertId());
      ++(std::string(table) == "sending" ? counts.sendings : counts.declines);
    }
  }

  // Responses: each supersedes whatever is current for its probe in the main
  // store when it lands, so every probe keeps one current response.
  {
    Stmt copy = main.Prepare(CopySql(main, "office", "response", "t.id = ?3", false, {"supersedes", "id"}));
    Stmt probe_of = main.Prepare("SELECT probe_id FROM office.response WHERE id = ?1");
    Stmt current = main.Prepare(
        "SELECT max(r.id) FROM main.response r WHERE r.probe_id = ?1 "
        "AND NOT EXISTS (SELECT 1 FROM main.response s WHERE s.supersedes = r.id)");
    for (int64_t id : new_rows("response")) {
      probe_of.Bind(1, id);
      probe_of.Step();
      const int64_t probe = probe_of.Int(0);
      probe_of.Reset();
      current.Bind(1, probe);
      current.Step();
      const bool has_current = !current.IsNull(0);
      const int64_t superseded = has_current ? current.Int(0) : 0;
      current.Reset();
      copy.Bind(1, seq);
      if (has_current) copy.Bind(2, superseded);
      else copy.BindNull(2);
      copy.Bind(3, id).Run();
      map_row("response", id, main.LastInsertId());
      ++counts.responses;
    }
  }

  // Mail messages keep their unique message id: one the main store logged
  // already is not logged twice (its decisions attach to the main row).
  {
    Stmt copy = main.Prepare(CopySql(main, "office", "mail_message", "t.id = ?2", false));
    Stmt known = main.Prepare(
        "SELECT count(*) FROM main.mail_message WHERE message_id = (SELECT message_id FROM office.mail_message "
        "WHERE id = ?1)");
    for (int64_t id : new_rows("mail_message")) {
      known.Bind(1, id);
      known.Step();
      const bool already = known.Int(0) > 0;
      known.Reset();
      if (already) continue;
      copy.Bind(1, seq).Bind(2, id).Run();
      map_row("mail_message", id, main.LastInsertId());
      ++counts.mail_messages;
    }
  }
  {
    Stmt copy = main.Prepare(CopySql(main, "office", "review_decision", "t.id = ?4", false,
                                     {"mail_message_id", "response_id", "id"}));
    Stmt message = main.Prepare(
        "SELECT m.id FROM main.mail_message m JOIN office.mail_message o ON o.message_id = m.message_id "
        "JOIN office.review_decision d ON d.mail_message_id = o.id WHERE d.id = ?1");
    Stmt response = main.Prepare(
        "SELECT m.main_row FROM office.review_decision d JOIN main.merged_row m ON m.office = ?2 "
        "AND m.tbl = 'response' AND m.office_row = d.response_id WHERE d.id = ?1");
    for (int64_t id : new_rows("review_decision")) {
      message.Bind(1, id);
      if (!message.Step()) throw StoreError("review decision " + std::to_string(id) + " of office " + office +
                                            " names a mail message the merge did not bring in");
      const int64_t main_message = message.Int(0);
      message.Reset();
      response.Bind(1, id).Bind(2, office);
      const bool has_response = response.Step();
      const int64_t main_response = has_response ? response.Int(0) : 0;
      response.Reset();
      copy.Bind(1, seq).Bind(2, main_message);
      if (has_response) copy.Bind(3, main_response);
      else copy.BindNull(3);
      copy.Bind(4, id).Run();
      map_row("review_decision", id, main.LastInsertId());
      ++counts.review_decisions;
    }
  }

  // The choices made on conflicts, and for the main store's the restated response.
  for (const MergeChoice& c : choices) {
    const int64_t office_current = main.QueryInt(
        "SELECT max(r.id) FROM main.response r WHERE r.probe_id = " + std::to_string(c.probe_id) +
        " AND NOT EXISTS (SELECT 1 FROM main.response s WHERE s.supersedes = r.id)");
    if (c.prefer == MergePreference::kMain) {
      Stmt restate = main.Prepare(CopySql(main, "main", "response", "t.id = ?2", false,
                                          {"id", "supersedes", "origin", "entered_by", "entered_at"}));
      restate.Bind(1, seq).Bind(2, c.main_response).Bind(3, office_current).Bind(4, "merge").Bind(5, actor);
      restate.Bind(6, at).Run();
    }
    Stmt ins = main.Prepare(
        "INSERT INTO main.merge_choice(office, probe_id, prefer, main_response, office_response, audit_seq) "
        "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
    ins.Bind(1, office).Bind(2, c.probe_id).Bind(3, MergePreferenceName(c.prefer)).Bind(4, c.main_response);
    ins.Bind(5, office_current).Bind(6, seq).Run();
    ++counts.choices;
  }

  Stmt merge = main.Prepare(
      "INSERT INTO main.office_merge(office, office_head, office_head_seq, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  merge.Bind(1, office).Bind(2, head.hash).Bind(3, head.seq).Bind(4, seq).Run();
  return counts;
}

std::vector<OfficeProbeState> ReadOfficeProbes(Store& main, const std::string& office) {
  Stmt q = main.Prepare(
      "SELECT p.id, (SELECT min(s.sent_at) FROM sending s WHERE s.probe_id = p.id), c.code, c.received_at "
      "FROM handout h JOIN handout_vacancy v ON v.handout_id = h.id "
      "JOIN probe p ON p.vacancy_id = v.vacancy_id AND p.plan_id = h.plan_id "
      "LEFT JOIN current_response c ON c.id = (SELECT max(x.id) FROM current_response x WHERE x.probe_id = p.id) "
      "WHERE h.office = ?1 ORDER BY p.id");
  q.Bind(1, office);
  std::vector<OfficeProbeState> out;
  while (q.Step()) out.push_back({q.Int(0), q.OptText(1), q.OptText(2), q.OptText(3)});
  return out;
}

}  // namespace twinprobe
