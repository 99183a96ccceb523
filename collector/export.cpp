#include "collector/export.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <memory>
#include <optional>
#include <unordered_map>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/meta.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

constexpr int kExportVersion = 1;

// One cell: missing, text, integer or yes/no.
struct Cell {
  enum Kind { kNull, kText, kInt, kBool } kind = kNull;
  std::string text;
  int64_t number = 0;
  static Cell Text(std::string s) { return {kText, std::move(s), 0}; }
  static Cell OptText(const std::optional<std::string>& s) { return s ? Text(*s) : Cell{}; }
  static Cell Int(int64_t v) { return {kInt, {}, v}; }
  static Cell Bool(bool b) { return {kBool, {}, b ? 1 : 0}; }
};

// Where rows go: a CSV file per table, or an array in one JSON document.
class TableSink {
 public:
  virtual ~TableSink() = default;
  virtual Status Begin(const std::string& table, const std::vector<std::string>& columns) = 0;
  virtual void Row(const std::vector<Cell>& cells) = 0;
  virtual Status End() = 0;
};

class CsvSink : public TableSink {
 public:
  explicit CsvSink(std::string dir) : dir_(std::move(dir)) {}
  Status Begin(const std::string& table, const std::vector<std::string>& columns) override {
    path_ = (fs::path(dir_) / (table + ".csv")).string();
    out_ = std::make_unique<std::ofstream>(path_, std::ios::binary | std::ios::trunc);
    if (!*out_) return BadInput(path_, "cannot write the export file", "check that the folder is writable");
    for (size_t i = 0; i < columns.size(); ++i) *out_ << (i ? "," : "") << CsvQuote(columns[i]);
    *out_ << "\r\n";
    return {};
  }
  void Row(const std::vector<Cell>& cells) override {
    for (size_t i = 0; i < cells.size(); ++i) {
      if (i) *out_ << ',';
      const Cell& c = cells[i];
      if (c.kind == Cell::kText) *out_ << CsvQuote(c.text);
      else if (c.kind != Cell::kNull) *out_ << c.number;
    }
    *out_ << "\r\n";
  }
  Status End() override {
    out_->close();
    if (!*out_) return BadInput(path_, "cannot write the export file", "check that the disk is not full");
    return {};
  }

 private:
  std::string dir_, path_;
  std::unique_ptr<std::ofstream> out_;
};

class JsonSink : public TableSink {
 public:
  explicit JsonSink(std::ostream& out) : out_(out) {}
  Status Begin(const std::string& table, const std::vector<std::string>& columns) override {
    columns_ = columns;
    out_ << ",\n  \"" << table << "\": [";
    first_ = true;
    return {};
  }
  void Row(const std::vector<Cell>& cells) override {
    nlohmann::ordered_json row = nlohmann::ordered_json::object();
    for (size_t i = 0; i < cells.size(); ++i) {
      const Cell& c = cells[i];
      switch (c.kind) {
        case Cell::kNull: row[columns_[i]] = nullptr; break;
        case Cell::kText: row[columns_[i]] = c.text; break;
        case Cell::kInt: row[columns_[i]] = c.number; break;
        case Cell::kBool: row[columns_[i]] = c.number != 0; break;
      }
    }
    out_ << (first_ ? "\n    " : ",\n    ") << row.dump();
    first_ = false;
  }
  Status End() override {
    out_ << (first_ ? "]" : "\n  ]");
    return {};
  }

 private:
  std::ostream& out_;
  std::vector<std::string> columns_;
  bool first_ = true;
};

// Stratum columns: the study's strata first (in their order), then any other
// stratum a vacancy carries. A name that clashes with a fixed column gets a
// "stratum_" prefix.
std::vector<std::string> StratumNames(Store& store, int64_t plan_id) {
  std::vector<std::string> names = MetaList(store, "strata");
  Stmt s = store.Prepare(
      "SELECT DISTINCT vs.name FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id WHERE v.plan_id = ?1 "
      "ORDER BY vs.name");
  s.Bind(1, plan_id);
  while (s.Step())
    if (std::find(names.begin(), names.end(), s.Text(0)) == names.end()) names.push_back(s.Text(0));
  return names;
}

std::string StratumColumn(const std::string& name, const std::vector<std::string>& fixed) {
  return std::find(fixed.begin(), fixed.end(), name) == fixed.end() ? name : "stratum_" + name;
}

// vacancy id -> its stratum values in `names` order ("" when missing),
// for the current plan. Held in memory: a few strings per vacancy.
std::unordered_map<int64_t, std::vector<std::string>> StrataByVacancy(Store& store, int64_t plan_id,
                                                                       const std::vector<std::string>& names) {
  std::unordered_map<std::string, size_t> index;
  for (size_t i = 0; i < names.size(); ++i) index[names[i]] = i;
  std::unordered_map<int64_t, std::vector<std::string>> out;
  Stmt s = store.Prepare(
      "SELECT vs.vacancy_id, vs.name, vs.value FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id "
      "WHERE v.plan_id = ?1");
  s.Bind(1, plan_id);
  while (s.Step()) {
    auto& values = out[s.Int(0)];
    values.resize(names.size());
    values[index.at(s.Text(1))] = s.Text(2);
  }
  return out;
}

void AddStrata(std::vector<Cell>& cells, const std::unordered_map<int64_t, std::vector<std::string>>& strata,
               int64_t vacancy_id, size_t n) {
  auto it = strata.find(vacancy_id);
  for (size_t i = 0; i < n; ++i) {
    if (it == strata.end() || it->second[i].empty()) cells.push_back(Cell{});
    else cells.push_back(Cell::Text(it->second[i]));
  }
}

Status WriteVacancies(Store& store, int64_t plan_id, const std::vector<std::string>& strata_names,
                      const std::unordered_map<int64_t, std::vector<std::string>>& strata, bool identities,
                      TableSink& sink, int64_t& count) {
  std::vector<std::string> fixed = {"vacancy", "employer_key"};
  if (identities) fixed.insert(fixed.end(), {"employer", "employer_contact"});
  fixed.insert(fixed.end(), {"source", "opened_on", "closed_on"});
  std::vector<std::string> columns = fixed;
  for (const auto& n : strata_names) columns.push_back(StratumColumn(n, fixed));
  Status s = sink.Begin("vacancies", columns);
  if (!s.ok()) return s;
  Stmt q = store.Prepare(
      "SELECT v.id, v.ref, v.employer_key, e.name, e.contact, v.source, v.opened_on, v.closed_on FROM vacancy v "
      "LEFT JOIN employer e ON e.key = v.employer_key WHERE v.plan_id = ?1 ORDER BY v.id");
  q.Bind(1, plan_id);
  std::vector<Cell> cells;
  while (q.Step()) {
    cells.clear();
    cells.push_back(Cell::Text(q.Text(1)));
    cells.push_back(Cell::OptText(q.OptText(2)));
    if (identities) {
      cells.push_back(Cell::OptText(q.OptText(3)));
      cells.push_back(Cell::OptText(q.OptText(4)));
    }
    for (int c : {5, 6, 7}) cells.push_back(Cell::OptText(q.OptText(c)));
    AddStrata(cells, strata, q.Int(0), strata_names.size());
    sink.Row(cells);
    ++count;
  }
  return sink.End();
}

Status WriteProbes(Store& store, int64_t plan_id, const OutcomeScheme& scheme,
                   const std::vector<std::string>& strata_names,
                   const std::unordered_map<int64_t, std::vector<std::string>>& strata, bool identities,
                   TableSink& sink, int64_t& count) {
  std::vector<std::string> fixed = {"probe", "vacancy", "arm", "reference", "profile"};
  if (identities) fixed.insert(fixed.end(), {"profile_mailbox", "profile_phone"});
  fixed.insert(fixed.end(), {"template", "send_order", "planned_at", "sent_at", "outcome", "positive", "received_at",
                             "channel", "late", "responses"});
  std::vector<std::string> columns = fixed;
  for (const auto& n : strata_names) columns.push_back(StratumColumn(n, fixed));
  Status s = sink.Begin("probes", columns);
  if (!s.ok()) return s;
  // One pass: the newest sending and the current response of each probe
  // come from correlated lookups on indexed columns.
  Stmt q = store.Prepare(
      "SELECT p.id, p.ref, v.ref, a.label, a.is_reference, pr.display_name, pr.mailbox, pr.phone, p.template, "
      "  p.send_order, p.planned_at, "
      "  (SELECT s.sent_at FROM sending s WHERE s.probe_id = p.id ORDER BY s.id DESC LIMIT 1), "
      "  r.code, r.received_at, r.channel, r.flags, "
      "  (SELECT count(*) FROM response c WHERE c.probe_id = p.id), p.vacancy_id "
      "FROM probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "LEFT JOIN profile pr ON pr.id = p.profile_id "
      "LEFT JOIN response r ON r.id = (SELECT cr.id FROM current_response cr WHERE cr.probe_id = p.id "
      "                                ORDER BY cr.id DESC LIMIT 1) "
      "WHERE p.plan_id = ?1 ORDER BY p.id");
  q.Bind(1, plan_id);
  std::vector<Cell> cells;
  while (q.Step()) {
    cells.clear();
    cells.push_back(Cell::Text(q.Text(1)));
    cells.push_back(Cell::Text(q.Text(2)));
    cells.push_back(Cell::Text(q.Text(3)));
    cells.push_back(Cell::Bool(q.Int(4) != 0));
    cells.push_back(Cell::OptText(q.OptText(5)));
    if (identities) {
      cells.push_back(Cell::OptText(q.OptText(6)));
      cells.push_back(Cell::OptText(q.OptText(7)));
    }
    cells.push_back(Cell::OptText(q.OptText(8)));
    cells.push_back(Cell::Int(q.Int(9)));
    cells.push_back(Cell::OptText(q.OptText(10)));
    cells.push_back(Cell::OptText(q.OptText(11)));
    const bool answered = !q.IsNull(12);
    cells.push_back(Cell::OptText(q.OptText(12)));
    cells.push_back(answered ? Cell::Bool(scheme.is_positive(q.Text(12))) : Cell{});
    cells.push_back(Cell::OptText(q.OptText(13)));
    cells.push_back(Cell::OptText(q.OptText(14)));
    cells.push_back(answered ? Cell::Bool(q.Text(15).find("late") != std::string::npos) : Cell{});
    cells.push_back(Cell::Int(q.Int(16)));
    AddStrata(cells, strata, q.Int(17), strata_names.size());
    sink.Row(cells);
    ++count;
  }
  return sink.End();
}

Status WriteResponses(Store& store, int64_t plan_id, const OutcomeScheme& scheme, bool identities, TableSink& sink,
                      int64_t& count) {
  std::vector<std::string> columns = {"response", "probe",      "code",       "positive",   "received_at",
                                      "channel",  "origin",     "flags",      "entered_by", "entered_at",
                                      "supersedes", "superseded_by", "current"};
  if (identities) columns.push_back("note");
  Status s = sink.Begin("responses", columns);
  if (!s.ok()) return s;
  Stmt q = store.Prepare(
      "SELECT r.id, p.ref, r.code, r.received_at, r.channel, r.origin, r.flags, r.entered_by, r.entered_at, "
      "  r.supersedes, (SELECT min(n.id) FROM response n WHERE n.supersedes = r.id), r.note, "
      "  r.id = (SELECT cr.id FROM current_response cr WHERE cr.probe_id = r.probe_id ORDER BY cr.id DESC LIMIT 1) "
      "FROM response r JOIN probe p ON p.id = r.probe_id WHERE p.plan_id = ?1 ORDER BY r.id");
  q.Bind(1, plan_id);
  std::vector<Cell> cells;
  while (q.Step()) {
    cells.clear();
    cells.push_back(Cell::Int(q.Int(0)));
    cells.push_back(Cell::Text(q.Text(1)));
    cells.push_back(Cell::Text(q.Text(2)));
    cells.push_back(Cell::Bool(scheme.is_positive(q.Text(2))));
    for (int c : {3, 4, 5}) cells.push_back(Cell::OptText(q.OptText(c)));
    cells.push_back(q.Text(6).empty() ? Cell{} : Cell::Text(q.Text(6)));
    cells.push_back(Cell::Text(q.Text(7)));
    cells.push_back(Cell::Text(q.Text(8)));
    cells.push_back(q.IsNull(9) ? Cell{} : Cell::Int(q.Int(9)));
    cells.push_back(q.IsNull(10) ? Cell{} : Cell::Int(q.Int(10)));
    cells.push_back(Cell::Bool(q.Int(12) != 0));
    if (identities) cells.push_back(Cell::OptText(q.OptText(11)));
    sink.Row(cells);
    ++count;
  }
  return sink.End();
}

nlohmann::ordered_json Manifest(Store& store, int64_t plan_id, const OutcomeScheme& scheme,
                                const std::vector<std::string>& strata_names, const ExportOptions& o) {
  Stmt p = store.Prepare("SELECT kind, origin FROM plan WHERE id = ?1");
  p.Bind(1, plan_id);
  p.Step();
  nlohmann::ordered_json arms = nlohmann::ordered_json::array();
  Stmt a = store.Prepare("SELECT label, is_reference FROM arm WHERE plan_id = ?1 ORDER BY is_reference DESC, id");
  a.Bind(1, plan_id);
  while (a.Step()) arms.push_back({{"label", a.Text(0)}, {"reference", a.Int(1) != 0}});
  AuditReport audit = VerifyAudit(store);
  return nlohmann::ordered_json{{"format", "twinprobe-export"},
                                {"version", kExportVersion},
                                {"study_id", MetaValue(store, "study_id").value_or("")},
                                {"title", MetaValue(store, "title").value_or("")},
                                {"kind", p.Text(0)},
                                {"plan_origin", p.Text(1)},
                                {"exported_at", NowIso()},
                                {"identities", o.identities},
                                {"arms", arms},
                                {"strata", strata_names},
                                {"outcome_codes", scheme.codes},
                                {"positive_codes", scheme.positive},
                                {"window_days", scheme.window_days},
                                {"audit_entries", audit.entries},
                                {"audit_head", audit.head_hash},
                                {"audit_intact", audit.ok()}};
}

}  // namespace

Result<ExportSummary> ExportStudy(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                  const ExportOptions& o) {
  int64_t plan_id = store.QueryInt("SELECT id FROM current_plan");
  if (plan_id == 0)
    return BadInput(store.path(), "the store holds no plan yet", "run 'twinprobe plan' or 'twinprobe import pairs' first");
  if (o.format != "csv" && o.format != "json")
    return BadInput("", "unknown export format '" + o.format + "'", "use --format csv or --format json");
  ExportSummary summary;
  summary.path = path;
  const std::vector<std::string> strata_names = StratumNames(store, plan_id);
  const auto strata = StrataByVacancy(store, plan_id, strata_names);
  nlohmann::ordered_json manifest = Manifest(store, plan_id, scheme, strata_names, o);
  summary.audit_head = manifest["audit_head"];

  auto write_tables = [&](TableSink& sink) -> Status {
    Status s = WriteVacancies(store, plan_id, strata_names, strata, o.identities, sink, summary.vacancies);
    if (s.ok()) s = WriteProbes(store, plan_id, scheme, strata_names, strata, o.identities, sink, summary.probes);
    if (s.ok()) s = WriteResponses(store, plan_id, scheme, o.identities, sink, summary.responses);
    return s;
  };
  std::error_code ec;
  if (o.format == "csv") {
    fs::create_directories(path, ec);
    if (ec || !fs::is_directory(path))
      return BadInput(path, "cannot create the export folder", "check the path, or pass --format json to write one file");
    CsvSink sink(path);
    Status s = write_tables(sink);
    if (!s.ok()) return s.error();
    manifest["files"] = {{"vacancies", "vacancies.csv"}, {"probes", "probes.csv"}, {"responses", "responses.csv"}};
    manifest["rows"] = {{"vacancies", summary.vacancies}, {"probes", summary.probes}, {"responses", summary.responses}};
    std::string manifest_path = (fs::path(path) / "manifest.json").string();
    std::ofstream out(manifest_path, std::ios::binary | std::ios::trunc);
    out << manifest.dump(2) << "\n";
    if (!out) return BadInput(manifest_path, "cannot write the export file", "check that the folder is writable");
    return summary;
  }
  if (fs::path(path).has_parent_path()) fs::create_directories(fs::path(path).parent_path(), ec);
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (!out) return BadInput(path, "cannot write the export file", "check that the folder exists and is writable");
  // The manifest's fields open the document; the tables follow as arrays.
  std::string head = manifest.dump(2);
  head.erase(head.find_last_of('}'));
  while (!head.empty() && (head.back() == '\n' || head.back() == ' ')) head.pop_back();
  out << head;
  JsonSink sink(out);
  Status s = write_tables(sink);
  if (!s.ok()) return s.error();
  out << "\n}\n";
  out.close();
  if (!out) return BadInput(path, "cannot write the export file", "check that the disk is not full");
  return summary;
}

}  // namespace twinprobe
