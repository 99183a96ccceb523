#include "collector/export.h"

#include <algorithm>
#include <cstdlib>
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
#include "core/ethics_gate.h"
#include "core/export_records.h"
#include "core/fieldwork.h"
#include "core/meta.h"
#include "core/read_design.h"
#include "core/read_listings.h"
#include "core/read_set_design.h"
#include "core/safe_write.h"
#include "core/spreadsheet_cell.h"

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

// Each table is written beside its name and renamed into place
// (core/safe_write.h); text cells that a spreadsheet would run as a formula
// get a leading "'" unless raw_cells (core/spreadsheet_cell.h).
class CsvSink : public TableSink {
 public:
  CsvSink(std::string dir, bool raw_cells) : dir_(std::move(dir)), raw_cells_(raw_cells) {}
  Status Begin(const std::string& table, const std::vector<std::string>& columns) override {
    path_ = (fs::path(dir_) / (table + ".csv")).string();
    auto file = SafeFile::Create(path_);
    if (!file.ok()) return BadInput(path_, "cannot write the export file", "check that the folder is writable");
    file_ = std::move(file.value());
    std::ostream& out = file_->out();
    for (size_t i = 0; i < columns.size(); ++i) out << (i ? "," : "") << CsvQuote(columns[i]);
    out << "\r\n";
    return {};
  }
  void Row(const std::vector<Cell>& cells) override {
    std::ostream& out = file_->out();
    for (size_t i = 0; i < cells.size(); ++i) {
      if (i) out << ',';
      const Cell& c = cells[i];
      if (c.kind == Cell::kText) out << CsvQuote(raw_cells_ ? c.text : NeutraliseCell(c.text));
      else if (c.kind != Cell::kNull) out << c.number;
    }
    out << "\r\n";
  }
  Status End() override {
    Status s = file_->Commit();
    file_.reset();
    if (!s.ok()) return BadInput(path_, "cannot write the export file", "check that the disk is not full");
    return {};
  }

 private:
  std::string dir_, path_;
  bool raw_cells_ = false;
  std::unique_ptr<SafeFile> file_;
};

// The files an export folder holds: an existing folder with anything else
// in it is not replaced (`--out ~/Documents` must not swap a folder away).
constexpr const char* kExportFiles[] = {"vacancies.csv", "probes.csv",   "responses.csv", "sendings.csv",
                                        "declines.csv",  "listings.csv", "manifest.json"};

Status CheckReplaceableFolder(const std::string& path) {
  std::error_code ec;
  auto st = fs::symlink_status(path, ec);
  if (ec || !fs::is_directory(st)) return {};  // missing (made new), or refused by SafeFolder
  for (const auto& entry : fs::directory_iterator(path, ec)) {
    const std::string name = entry.path().filename().string();
    if (std::find(std::begin(kExportFiles), std::end(kExportFiles), name) == std::end(kExportFiles))
      return BadInput(path, "the folder holds '" + name + "', which is not part of an export",
                      "choose a new folder with --out, or empty this one; an export replaces its whole folder");
  }
  return {};
}

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
  for (const std::string& name : ReadVacancyStratumNames(store, plan_id))
    if (std::find(names.begin(), names.end(), name) == names.end()) names.push_back(name);
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
  ForEachVacancyStratum(store, plan_id, [&](int64_t vacancy_id, const std::string& name, const std::string& value) {
    auto& values = out[vacancy_id];
    values.resize(names.size());
    values[index.at(name)] = value;
  });
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

// Each probe's level of every factor of the design (issue 20), in the
// design's factor order; held in memory like the strata.
struct FactorLevels {
  std::vector<std::string> names;
  std::unordered_map<std::string, std::vector<std::string>> by_probe;  // probe ref -> levels in `names` order
};

FactorLevels ReadFactorLevels(Store& store) {
  FactorLevels out;
  for (const StoredFactor& f : ReadStoredDesign(store).factors) out.names.push_back(f.name);
  for (const PlannedSetDesign& set : ReadSetDesigns(store))
    for (const SetProbeDesign& p : set.probes) {
      std::vector<std::string>& levels = out.by_probe[p.probe_ref];
      for (const std::string& name : out.names) {
        auto it = p.levels.find(name);
        levels.push_back(it == p.levels.end() ? "" : it->second);
      }
    }
  return out;
}

// A factor column named like a fixed column gets a "factor_" prefix.
std::string FactorColumn(const std::string& name, const std::vector<std::string>& fixed) {
  return std::find(fixed.begin(), fixed.end(), name) == fixed.end() ? name : "factor_" + name;
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
  std::vector<Cell> cells;
  ForEachExportVacancy(store, plan_id, [&](const ExportVacancyRow& v) {
    cells.clear();
    cells.push_back(Cell::Text(v.ref));
    cells.push_back(Cell::OptText(v.employer_key));
    if (identities) {
      cells.push_back(Cell::OptText(v.employer_name));
      cells.push_back(Cell::OptText(v.employer_contact));
    }
    for (const auto* c : {&v.source, &v.opened_on, &v.closed_on}) cells.push_back(Cell::OptText(*c));
    AddStrata(cells, strata, v.id, strata_names.size());
    sink.Row(cells);
    ++count;
  });
  return sink.End();
}

Status WriteProbes(Store& store, int64_t plan_id, const OutcomeScheme& scheme, int64_t now,
                   const std::vector<std::string>& strata_names,
                   const std::unordered_map<int64_t, std::vector<std::string>>& strata, const FactorLevels& factors,
                   bool identities, TableSink& sink, int64_t& count) {
  std::vector<std::string> fixed = {"probe", "vacancy", "arm", "reference", "profile"};
  if (identities) fixed.insert(fixed.end(), {"profile_mailbox", "profile_phone"});
  fixed.insert(fixed.end(), {"template", "send_order", "planned_at", "sent_at", "outcome", "positive", "received_at",
                             "channel", "late", "responses", "state"});
  std::vector<std::string> columns = fixed;
  for (const auto& n : factors.names) columns.push_back(FactorColumn(n, fixed));
  // A stratum named like a factor is prefixed too: the factor columns are fixed for it.
  std::vector<std::string> taken = columns;
  for (const auto& n : strata_names) columns.push_back(StratumColumn(n, taken));
  Status s = sink.Begin("probes", columns);
  if (!s.ok()) return s;
  std::vector<Cell> cells;
  // `late` and `state` by the one window rule (core/fieldwork.h) at the study clock.
  ForEachExportProbe(store, plan_id, [&](const ExportProbeRow& p) {
    cells.clear();
    cells.push_back(Cell::Text(p.ref));
    cells.push_back(Cell::Text(p.vacancy_ref));
    cells.push_back(Cell::Text(p.arm));
    cells.push_back(Cell::Bool(p.is_reference));
    cells.push_back(Cell::OptText(p.profile));
    if (identities) {
      cells.push_back(Cell::OptText(p.mailbox));
      cells.push_back(Cell::OptText(p.phone));
    }
    cells.push_back(Cell::OptText(p.template_name));
    cells.push_back(Cell::Int(p.send_order));
    cells.push_back(Cell::OptText(p.planned_at));
    cells.push_back(Cell::OptText(p.sent_at));
    const bool answered = p.code.has_value();
    cells.push_back(Cell::OptText(p.code));
    cells.push_back(answered ? Cell::Bool(scheme.is_positive(*p.code)) : Cell{});
    cells.push_back(Cell::OptText(p.received_at));
    cells.push_back(Cell::OptText(p.channel));
    ProbeClock clock;
    if (p.first_sent_at) clock.sent_at = ParseIsoTime(*p.first_sent_at);
    clock.answered = answered && *p.code != "none";
    if (clock.answered && p.received_at) clock.answered_at = ParseIsoTime(*p.received_at);
    cells.push_back(answered ? Cell::Bool(IsLate(clock, scheme.window_days)) : Cell{});
    cells.push_back(Cell::Int(p.responses));
    cells.push_back(Cell::Text(ProbeStateName(StateOf(clock, now, scheme.window_days, answered, p.withdrawn))));
    auto levels = factors.by_probe.find(p.ref);
    for (size_t f = 0; f < factors.names.size(); ++f) {
      if (levels == factors.by_probe.end() || levels->second[f].empty()) cells.push_back(Cell{});
      else cells.push_back(Cell::Text(levels->second[f]));
    }
    AddStrata(cells, strata, p.vacancy_id, strata_names.size());
    sink.Row(cells);
    ++count;
  });
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
  std::vector<Cell> cells;
  ForEachExportResponse(store, plan_id, [&](const ExportResponseRow& r) {
    cells.clear();
    cells.push_back(Cell::Int(r.id));
    cells.push_back(Cell::Text(r.probe_ref));
    cells.push_back(Cell::Text(r.code));
    cells.push_back(Cell::Bool(scheme.is_positive(r.code)));
    for (const auto* c : {&r.received_at, &r.channel, &r.origin}) cells.push_back(Cell::OptText(*c));
    cells.push_back(r.flags.empty() ? Cell{} : Cell::Text(r.flags));
    cells.push_back(Cell::Text(r.entered_by));
    cells.push_back(Cell::Text(r.entered_at));
    cells.push_back(r.supersedes ? Cell::Int(*r.supersedes) : Cell{});
    cells.push_back(r.superseded_by ? Cell::Int(*r.superseded_by) : Cell{});
    cells.push_back(Cell::Bool(r.current));
    if (identities) cells.push_back(Cell::OptText(r.note));
    sink.Row(cells);
    ++count;
  });
  return sink.End();
}

Status WriteSendings(Store& store, int64_t plan_id, TableSink& sink, int64_t& count) {
  Status s = sink.Begin("sendings", {"sending", "probe", "sent_at", "channel", "sent_by", "entered_by", "entered_at",
                                     "current"});
  if (!s.ok()) return s;
  std::vector<Cell> cells;
  ForEachExportSending(store, plan_id, [&](const ExportSendingRow& r) {
    cells = {Cell::Int(r.id),          Cell::Text(r.probe_ref),  Cell::Text(r.sent_at),    Cell::OptText(r.channel),
             Cell::OptText(r.sent_by), Cell::Text(r.entered_by), Cell::Text(r.entered_at), Cell::Bool(r.current)};
    sink.Row(cells);
    ++count;
  });
  return sink.End();
}

// One row per decline with the deadline of the response it declines: the
// response's time plus [ethics] decline_within_hours as stored with the
// plan (core/ethics_gate.h DeclineDeadline, the rule `decline` checks).
Status WriteDeclines(Store& store, int64_t plan_id, TableSink& sink, int64_t& count) {
  Status s = sink.Begin("declines", {"decline", "probe", "vacancy", "response", "code", "received_at", "deadline",
                                     "declined_at", "on_time", "channel", "entered_by", "entered_at"});
  if (!s.ok()) return s;
  EthicsBlock ethics;
  if (auto hours = MetaValue(store, "ethics.decline_within_hours")) ethics.decline_within_hours = std::atoi(hours->c_str());
  std::vector<Cell> cells;
  ForEachExportDecline(store, plan_id, [&](const ExportDeclineRow& r) {
    std::optional<int64_t> received = r.received_at ? ParseIsoTime(*r.received_at) : std::nullopt;
    std::optional<int64_t> deadline;
    if (received && ethics.decline_within_hours > 0) deadline = DeclineDeadline(ethics, *received);
    std::optional<int64_t> declined = ParseIsoTime(r.declined_at);
    cells = {Cell::Int(r.id),
             Cell::Text(r.probe_ref),
             Cell::Text(r.vacancy_ref),
             r.response_id ? Cell::Int(*r.response_id) : Cell{},
             Cell::OptText(r.code),
             Cell::OptText(r.received_at),
             deadline ? Cell::Text(FormatIsoTime(*deadline)) : Cell{},
             Cell::Text(r.declined_at),
             deadline && declined ? Cell::Bool(*declined <= *deadline) : Cell{},
             Cell::OptText(r.channel),
             Cell::Text(r.entered_by),
             Cell::Text(r.entered_at)};
    sink.Row(cells);
    ++count;
  });
  return sink.End();
}

nlohmann::ordered_json Manifest(Store& store, const ExportPlanRow& plan, const OutcomeScheme& scheme,
                                const std::vector<std::string>& strata_names, const ExportOptions& o) {
  nlohmann::ordered_json arms = nlohmann::ordered_json::array();
  for (const ExportArmRow& a : ReadExportArms(store, plan.id))
    arms.push_back({{"label", a.label}, {"reference", a.is_reference}});
  AuditReport audit = VerifyAudit(store);
  return nlohmann::ordered_json{{"format", "twinprobe-export"},
                                {"version", kExportVersion},
                                {"study_id", MetaValue(store, "study_id").value_or("")},
                                {"title", MetaValue(store, "title").value_or("")},
                                {"kind", plan.kind},
                                {"plan_origin", plan.origin},
                                {"exported_at", NowIso()},
                                {"identities", o.identities},
                                {"raw_cells", o.raw_cells},
                                {"arms", arms},
                                {"strata", strata_names},
                                {"outcome_codes", scheme.codes},
                                {"positive_codes", scheme.positive},
                                {"window_days", scheme.window_days},
                                {"audit_entries", audit.entries},
                                {"audit_head", audit.head_hash},
                                {"audit_intact", audit.ok()}};
}

// A listing audit's store holds ranked lists and no plan: one table, one
// row per place in a list, with each item's level of every factor.
Status WriteListings(const ListingData& d, TableSink& sink, int64_t& count) {
  std::vector<std::string> columns = {"listing", "query", "location", "seen_by", "position", "item"};
  for (const auto& f : d.factors) columns.push_back(f);
  Status s = sink.Begin("listings", columns);
  if (!s.ok()) return s;
  std::vector<Cell> cells;
  for (size_t l = 0; l < d.listings.size(); ++l) {
    const ListingList& list = d.listings[l];
    const auto& [query, location] = d.strata[static_cast<size_t>(list.stratum)];
    for (int32_t a : list.appearances) {
      const ListingAppearance& place = d.appearances[static_cast<size_t>(a)];
      cells.clear();
      cells.push_back(Cell::Int(static_cast<int64_t>(l) + 1));
      cells.push_back(query.empty() ? Cell{} : Cell::Text(query));
      cells.push_back(location.empty() ? Cell{} : Cell::Text(location));
      cells.push_back(list.seen_by.empty() ? Cell{} : Cell::Text(list.seen_by));
      cells.push_back(Cell::Int(place.position));
      cells.push_back(Cell::Text(d.item_keys[static_cast<size_t>(place.item)]));
      const std::vector<int32_t>& levels = d.item_level[static_cast<size_t>(place.item)];
      for (size_t f = 0; f < d.factors.size(); ++f)
        cells.push_back(f < levels.size() && levels[f] >= 0 ? Cell::Text(d.levels[f][static_cast<size_t>(levels[f])])
                                                            : Cell{});
      sink.Row(cells);
      ++count;
    }
  }
  return sink.End();
}

nlohmann::ordered_json ListingManifest(Store& store, const ListingData& d, const ExportOptions& o) {
  nlohmann::ordered_json factors = nlohmann::ordered_json::array();
  for (size_t f = 0; f < d.factors.size(); ++f) factors.push_back({{"name", d.factors[f]}, {"levels", d.levels[f]}});
  AuditReport audit = VerifyAudit(store);
  return nlohmann::ordered_json{{"format", "twinprobe-export"},
                                {"version", kExportVersion},
                                {"study_id", MetaValue(store, "study_id").value_or("")},
                                {"title", MetaValue(store, "title").value_or("")},
                                {"kind", "listing"},
                                {"exported_at", NowIso()},
                                {"identities", o.identities},
                                {"factors", factors},
                                {"lists", d.listings.size()},
                                {"audit_entries", audit.entries},
                                {"audit_head", audit.head_hash},
                                {"audit_intact", audit.ok()}};
}

}  // namespace

Result<ExportSummary> ExportStudy(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                  const ExportOptions& o) {
  const std::optional<ExportPlanRow> plan = ReadExportPlan(store);
  // A listing audit has ranked lists and no plan (issue 24): it exports them.
  const ListingData listings = plan ? ListingData{} : ReadListings(store);
  if (!plan && listings.listings.empty())
    return BadInput(store.path(), "the store holds no plan yet", "run 'twinprobe plan' or 'twinprobe import pairs' first");
  if (o.format != "csv" && o.format != "json")
    return BadInput("", "unknown export format '" + o.format + "'", "use --format csv or --format json");
  const int64_t plan_id = plan ? plan->id : 0;
  ExportSummary summary;
  summary.path = path;
  summary.listing_only = !plan;
  const std::vector<std::string> strata_names = plan ? StratumNames(store, plan_id) : std::vector<std::string>{};
  const auto strata = StrataByVacancy(store, plan_id, strata_names);
  const FactorLevels factors = plan ? ReadFactorLevels(store) : FactorLevels{};
  nlohmann::ordered_json manifest =
      plan ? Manifest(store, *plan, scheme, strata_names, o) : ListingManifest(store, listings, o);
  summary.audit_head = manifest["audit_head"];

  auto write_tables = [&](TableSink& sink) -> Status {
    if (!plan) return WriteListings(listings, sink, summary.listing_places);
    Status s = WriteVacancies(store, plan_id, strata_names, strata, o.identities, sink, summary.vacancies);
    if (s.ok())
      s = WriteProbes(store, plan_id, scheme, o.now.value_or(NowEpoch()), strata_names, strata, factors, o.identities,
                      sink, summary.probes);
    if (s.ok()) s = WriteResponses(store, plan_id, scheme, o.identities, sink, summary.responses);
    if (s.ok()) s = WriteSendings(store, plan_id, sink, summary.sendings);
    if (s.ok()) s = WriteDeclines(store, plan_id, sink, summary.declines);
    return s;
  };
  std::error_code ec;
  if (o.format == "csv") {
    // Written into a new folder beside `path` and swapped into place whole:
    // a killed export leaves the old folder (or none), never half of one.
    if (Status s = CheckReplaceableFolder(path); !s.ok()) return s.error();
    if (fs::path(path).has_parent_path()) fs::create_directories(fs::path(path).parent_path(), ec);
    auto folder = SafeFolder::Create(path);
    if (!folder.ok()) return folder.error();
    CsvSink sink(folder.value()->path(), o.raw_cells);
    Status s = write_tables(sink);
    if (!s.ok()) return s.error();
    if (!plan) {
      manifest["files"] = {{"listings", "listings.csv"}};
      manifest["rows"] = {{"listings", summary.listing_places}};
    } else {
      manifest["files"] = {{"vacancies", "vacancies.csv"}, {"probes", "probes.csv"},   {"responses", "responses.csv"},
                           {"sendings", "sendings.csv"},   {"declines", "declines.csv"}};
      manifest["rows"] = {{"vacancies", summary.vacancies}, {"probes", summary.probes},     {"responses", summary.responses},
                          {"sendings", summary.sendings},   {"declines", summary.declines}};
    }
    std::string manifest_path = (fs::path(folder.value()->path()) / "manifest.json").string();
    if (Status m = WriteFileSafely(manifest_path, manifest.dump(2) + "\n"); !m.ok())
      return BadInput((fs::path(path) / "manifest.json").string(), "cannot write the export file",
                      "check that the folder is writable");
    if (Status c = folder.value()->Commit(); !c.ok()) return c.error();
    return summary;
  }
  if (fs::path(path).has_parent_path()) fs::create_directories(fs::path(path).parent_path(), ec);
  auto file = SafeFile::Create(path);
  if (!file.ok()) return BadInput(path, "cannot write the export file", "check that the folder exists and is writable");
  std::ostream& out = file.value()->out();
  // The manifest's fields open the document; the tables follow as arrays.
  std::string head = manifest.dump(2);
  head.erase(head.find_last_of('}'));
  while (!head.empty() && (head.back() == '\n' || head.back() == ' ')) head.pop_back();
  out << head;
  JsonSink sink(out);
  Status s = write_tables(sink);
  if (!s.ok()) return s.error();
  out << "\n}\n";
  if (!file.value()->Commit().ok()) return BadInput(path, "cannot write the export file", "check that the disk is not full");
  return summary;
}

}  // namespace twinprobe
