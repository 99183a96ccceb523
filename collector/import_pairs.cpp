#include "collector/import_pairs.h"

#include <algorithm>
#include <cctype>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <limits>
#include <memory>
#include <optional>
#include <unordered_map>
#include <unordered_set>

#include "collector/event_time.h"
#include "collector/import_support.h"
#include "collector/stage_columns.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/covariate_records.h"
#include "core/echoed_value.h"
#include "core/csv.h"
#include "core/import_lock.h"
#include "core/import_pairs_writer.h"
#include "core/meta.h"
#include "core/near_duplicates.h"
#include "core/plan_header.h"
#include "core/progress.h"
#include "core/pseudonym.h"
#include "core/store.h"
#include "core/suggest.h"
#include "core/text.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

// More distinct values than this in the arm column is not an arm column.
constexpr size_t kMaxArms = 64;
constexpr uint32_t kNone = std::numeric_limits<uint32_t>::max();
constexpr const char* kTimeFormat = "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)";

const std::vector<std::string> kFixedColumns = {"vacancy", "arm", "outcome", "sent_at", "responded_at",
                                                "probe", "employer"};

std::string Join(const std::vector<std::string>& v, const std::string& separator = ", ") {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : separator) + x;
  return s;
}

// What the rows are called in messages.
std::string RowNoun(bool records) { return records ? "application" : "probe"; }

std::string Quoted(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "'" : ", '") + x + "'";
  return s;
}

// Distinct strings as small integers (strata values, employers).
class Interner {
 public:
  uint32_t Id(const std::string& s) {
    auto [it, inserted] = ids_.try_emplace(s, static_cast<uint32_t>(names_.size()));
    if (inserted) names_.push_back(s);
    return it->second;
  }
  const std::string& Name(uint32_t id) const { return names_[id]; }

 private:
  std::unordered_map<std::string, uint32_t> ids_;
  std::vector<std::string> names_;
};

// What the file is checked against: the study's arms, scheme and strata,
// from the design, an earlier import, or (discover) the file itself.
struct Target {
  bool append = false;  // joins the current imported plan
  int64_t plan_id = 0;
  std::string kind;
  OutcomeScheme scheme;
  bool has_design = false;
  bool discover = false;  // arms come from the file
  std::vector<std::string> arms;              // labels by index
  std::vector<int64_t> arm_rows;              // good rows per arm (pass 1)
  std::vector<int64_t> arm_first_line;        // first good row per arm (pass 1)
  std::unordered_map<std::string, int> arm_of;  // accepted values -> index
  int reference = -1;
  std::vector<int64_t> arm_ids;  // store ids by index (append)
  std::vector<std::string> strata;
  std::string strata_source;  // names where the strata came from, for messages
  std::unordered_set<std::string> existing_vacancies, existing_probes;
  int64_t next_serial = 1;
  bool records = false;     // applicant records (import applications)
  bool open_codes = false;  // --positive given: any outcome value is a code, collected in pass 1
  bool staged = false;      // --stages given: the outcome is the furthest stage reached
  std::vector<std::string> covariates;  // covariate columns (--covariates)
  std::vector<std::string> stage_names;  // the hiring stages in order (--stages, or the study's)
  // Records of an unpaired study may leave out the vacancy column; with it,
  // a vacancy holds any number of applications and is also a stratum.
  bool many_per_vacancy() const { return records && kind == "unpaired"; }

  void IndexArms() {
    arm_of.clear();
    for (size_t i = 0; i < arms.size(); ++i) {
      arm_of.emplace(arms[i], static_cast<int>(i));
      // "origin=coastal" may be written "coastal" when there is one factor.
      size_t eq = arms[i].find('=');
      if (eq != std::string::npos && arms[i].find(',') == std::string::npos)
        arm_of.emplace(arms[i].substr(eq + 1), static_cast<int>(i));
    }
  }
  std::vector<std::string> AcceptedArmValues() const {
    std::vector<std::string> v;
    for (const auto& [value, index] : arm_of) v.push_back(value);
    std::sort(v.begin(), v.end());
    return v;
  }
};

OutcomeScheme SchemeWithoutDesign() {
  OutcomeScheme s;
  s.codes.push_back("0");
  s.codes.push_back("1");
  s.positive.push_back("1");
  return s;
}

Result<Target> BuildTarget(Store* store, const Design* design, const PairsImportOptions& o) {
  Target t;
  for (const auto& s : o.strata)
    if (FindColumn(kFixedColumns, s) >= 0)
      return BadInput("", "'" + s + "' is a column of its own and cannot be a stratum", "name other columns with --strata");
  if (o.covariates.size() > kMaxCovariates)
    return BadInput("--covariates", "names " + std::to_string(o.covariates.size()) + " columns; at most " +
                                        std::to_string(kMaxCovariates) + " covariates are kept",
                    "keep the job-relevant covariates the adjustment needs");
  for (size_t i = 0; i < o.covariates.size(); ++i) {
    const std::string& name = o.covariates[i];
    if (FindColumn(kFixedColumns, name) >= 0 || FindColumn(o.strata, name) >= 0)
      return BadInput("--covariates", "'" + name + "' is " +
                                          (FindColumn(kFixedColumns, name) >= 0 ? "a column of its own" : "a stratum") +
                                          " and cannot also be a covariate",
                      "name other columns with --covariates");
    for (size_t j = 0; j < i; ++j)
      if (o.covariates[j] == name)
        return BadInput("--covariates", "'" + name + "' is named twice", "name each covariate column once");
  }
  t.covariates = o.covariates;
  if (store) {
    if (auto p = ReadImportPlan(*store)) {
      if (p->origin != "import")
        return BadInput(store->path(),
                        "this study was planned with 'twinprobe plan'; 'import pairs' brings in a whole dataset "
                        "collected elsewhere",
                        "use 'import outcomes' for responses to the planned probes, or import into a new folder");
      t.append = true;
      t.plan_id = p->id;
      t.kind = p->kind;
      if (!o.kind.empty() && o.kind != t.kind)
        return BadInput("", "--kind " + o.kind + " differs from the study's kind (" + t.kind + ")",
                        "a later import joins the study of the first; leave --kind out");
    }
  }
  t.records = o.records;
  if (t.append) {
    for (const ImportArmRow& a : ReadImportArms(*store, t.plan_id)) {
      if (a.is_reference) t.reference = static_cast<int>(t.arms.size());
      t.arm_ids.push_back(a.id);
      t.arms.push_back(a.label);
    }
    t.scheme = design ? design->outcomes : StoredOutcomeScheme(*store);
    t.has_design = design != nullptr;
    std::vector<std::string> stored = MetaList(*store, "strata");
    if (o.strata_given) {
      std::vector<std::string> a = o.strata, b = stored;
      std::sort(a.begin(), a.end());
      std::sort(b.begin(), b.end());
      if (a != b)
        return BadInput("", "--strata " + Join(o.strata) + " differs from the study's strata (" +
                                (stored.empty() ? "none" : Join(stored)) + ")",
                        "a later import has the strata of the first; leave --strata out");
    }
    t.strata = stored;
    t.strata_source = "the study (set by its first import)";
    t.stage_names = MetaList(*store, "stages");
    if (!o.stages.empty() && o.stages != MetaList(*store, "stages"))
      return BadInput("", "--stages " + Join(o.stages) + " differs from the study's stages",
                      "a later import keeps the stages of the first; leave --stages out");
    if (o.covariates != MetaList(*store, "covariates"))
      return BadInput("", "--covariates " + (o.covariates.empty() ? std::string("(none)") : Join(o.covariates)) +
                              " differs from the study's covariates (" +
                              (MetaList(*store, "covariates").empty() ? std::string("none")
                                                                      : Join(MetaList(*store, "covariates"))) + ")",
                      "a later import keeps the covariates of the first; give the same --covariates");
    if (!o.positive.empty() && o.positive != t.scheme.positive)
      return BadInput("", "--positive " + Join(o.positive) + " differs from the study's positive outcomes (" +
                              Join(t.scheme.positive) + ")",
                      "a later import keeps the outcomes of the first; leave --positive out");
    // --id names a new study; on a later import it would be dropped without
    // a word, so a different id is refused like a different --strata.
    const std::string stored_id = MetaValue(*store, "study_id").value_or("");
    if (!o.study_id.empty() && o.study_id != stored_id)
      return BadInput("", "--id " + o.study_id + " differs from the study's id (" + stored_id + ")",
                      "a later import joins the study of the first; leave --id out");
    for (std::string& ref : ReadVacancyRefs(*store, t.plan_id)) t.existing_vacancies.insert(std::move(ref));
    for (std::string& ref : ReadProbeRefs(*store, t.plan_id)) t.existing_probes.insert(std::move(ref));
    t.next_serial = 1 + MaxProbeSerial(*store);
  } else if (design) {
    t.has_design = true;
    t.kind = design->kind;
    if (!o.kind.empty() && o.kind != t.kind)
      return BadInput("", "--kind " + o.kind + " differs from study.toml's kind (" + t.kind + ")",
                      "leave --kind out, or import into a folder without study.toml");
    if (!o.positive.empty() || !o.stages.empty())
      return BadInput("", std::string(o.stages.empty() ? "--positive" : "--stages") +
                              " is given, but study.toml's [outcomes] says which codes there are and which are positive",
                      "leave --positive out, or import into a folder without study.toml");
    t.scheme = design->outcomes;
    for (const auto& a : design->arms) t.arms.push_back(a.label);
    t.reference = design->reference_arm;
    t.strata = o.strata_given ? o.strata : design->strata;
    t.strata_source = o.strata_given ? "--strata" : "study.toml [strata]";
  } else {
    t.discover = true;
    t.kind = o.kind;
    t.scheme = SchemeWithoutDesign();
    if (!o.stages.empty()) {
      t.staged = true;
      t.stage_names = o.stages;
      t.scheme.codes = o.stages;
      t.scheme.positive = o.positive.empty() ? std::vector<std::string>(o.stages.begin() + 1, o.stages.end()) : o.positive;
      for (const std::string& value : t.scheme.positive)
        if (!t.scheme.has_code(value))
          return BadInput("", "--positive '" + value + "' is not one of the stages" + DidYouMean(value, o.stages),
                          "name stages of --stages: " + Join(o.stages));
    } else if (!o.positive.empty()) {
      t.open_codes = true;
      t.scheme.codes.clear();
      t.scheme.positive = o.positive;
    }
    t.strata = o.strata;
    t.strata_source = "--strata";
  }
  t.IndexArms();
  if (!t.discover && !o.reference.empty()) {
    auto it = t.arm_of.find(o.reference);
    if (it == t.arm_of.end() || it->second != t.reference)
      return BadInput("", "--reference '" + o.reference + "' differs from the study's reference arm '" +
                              t.arms[static_cast<size_t>(t.reference)] + "'",
                      "leave --reference out; the reference arm is set by the design or the first import");
  }
  t.arm_rows.assign(t.arms.size(), 0);
  t.arm_first_line.assign(t.arms.size(), 0);
  return t;
}

struct Columns {
  size_t count = 0;
  int vacancy = -1, arm = -1, outcome = -1, sent_at = -1, responded_at = -1, probe = -1, employer = -1;
  std::vector<int> strata;
  std::vector<int> covariates;
  // Stages as one yes/no column each (every stage names a column): the
  // outcome is derived, appended to each record as field `outcome`.
  std::vector<int> stage_columns;
};

// `header` holds the role names (after --columns); `file_header` the
// file's own, for messages.
Result<Columns> FindColumns(const std::vector<std::string>& header, const std::vector<std::string>& file_header,
                            Target& t, const std::string& path, std::vector<std::string>& ignored) {
  Columns c;
  c.count = header.size();
  // --stages naming a column each: per-stage yes/no flags, not one ordered
  // outcome column.
  bool flags = !t.stage_names.empty();
  for (const auto& stage : t.stage_names) flags = flags && FindColumn(header, stage) >= 0;
  if (flags) {
    if (FindColumn(header, "outcome") >= 0)
      return BadInput(path + ":1", "the file has an outcome column and a column for every stage",
                      "keep one of the two: the stage columns (yes/no each) or the outcome column (the furthest "
                      "stage reached), and leave the other out of the file or of --columns");
    for (const auto& stage : t.stage_names) c.stage_columns.push_back(FindColumn(header, stage));
  }
  std::vector<std::string> other;
  for (size_t i = 0; i < header.size(); ++i)
    if (FindColumn(kFixedColumns, header[i]) < 0 && FindColumn(t.strata, header[i]) < 0 &&
        FindColumn(t.covariates, header[i]) < 0 && !IsRejectColumn(header[i]) &&
        std::find(c.stage_columns.begin(), c.stage_columns.end(), static_cast<int>(i)) == c.stage_columns.end())
      other.push_back(file_header[i]);
  for (const char* required : {"vacancy", "arm", "outcome"}) {
    if (FindColumn(header, required) >= 0) continue;
    if (std::string(required) == "outcome" && flags) continue;  // derived from the stage columns
    if (std::string(required) == "vacancy" && t.many_per_vacancy()) continue;  // each row is its own
    if (t.records)
      return BadInput(path + ":1", std::string("the column '") + required + "' is missing" + DidYouMean(required, other),
                      std::string("name the file's ") + required + " column with --columns " + required +
                          "=COLUMN; the file's columns are " + Quoted(file_header));
    return BadInput(path + ":1", std::string("the column '") + required + "' is missing" + DidYouMean(required, other),
                    "a pairs file has the columns vacancy,arm,outcome, optionally sent_at,responded_at,probe,employer, "
                    "and its stratum columns");
  }
  // An unpaired study's requisitions are strata: the Mantel–Haenszel
  // analysis compares the groups within each one.
  if (t.many_per_vacancy() && FindColumn(header, "vacancy") >= 0 && FindColumn(t.strata, "vacancy") < 0)
    t.strata.push_back("vacancy");
  for (const auto& s : t.strata) {
    int i = FindColumn(header, s);
    if (i < 0)
      return BadInput(path + ":1",
                      "the stratum column '" + s + "' named in " + t.strata_source + " is missing" + DidYouMean(s, other),
                      "add the column, or name the file's stratum columns with --strata");
    c.strata.push_back(i);
  }
  for (const auto& name : t.covariates) {
    int i = FindColumn(header, name);
    if (i < 0)
      return BadInput(path + ":1", "the covariate column '" + name + "' named by --covariates is missing" +
                                       DidYouMean(name, other),
                      "name one of the file's columns: " + Quoted(file_header));
    c.covariates.push_back(i);
  }
  c.vacancy = FindColumn(header, "vacancy");
  c.arm = FindColumn(header, "arm");
  c.outcome = flags ? static_cast<int>(header.size()) : FindColumn(header, "outcome");
  c.sent_at = FindColumn(header, "sent_at");
  c.responded_at = FindColumn(header, "responded_at");
  c.probe = FindColumn(header, "probe");
  c.employer = FindColumn(header, "employer");
  ignored = other;
  return c;
}

std::string OutcomeFix(const Target& t) {
  if (!t.has_design) return "use 1 or 0 (a positive callback or not), or one of: none, rejection, info_request, invitation, offer";
  std::string fix = "use one of: " + Join(t.scheme.codes);
  if (!t.scheme.has_code("1"))
    fix += " (for 1/0 data, add \"0\" and \"1\" to [outcomes].codes and \"1\" to positive in study.toml)";
  return fix;
}

// The vacancy a row belongs to; without a vacancy column (records of an
// unpaired study) each row is a vacancy of its own, keyed by its line.
std::string VacancyKey(const CsvRecord& r, const Columns& c) {
  if (c.vacancy >= 0) return r.fields[c.vacancy];
  return "\x01" + std::to_string(r.line);
}

// With stage columns: appends the furthest stage the row reached as its
// outcome field (collector/stage_columns.h).
std::optional<Error> AppendStageOutcome(CsvRecord& r, const Columns& c, const Target& t, const std::string& path) {
  Status count = CheckFieldCount(r, c.count, path);
  if (!count.ok()) return count.error();
  auto stage = FurthestStage(r, c.stage_columns, t.stage_names, path);
  if (!stage.ok()) return stage.error();
  r.fields.push_back(t.stage_names[stage.value()]);
  return std::nullopt;
}

// One row's values, checked on their own (cross-row checks come after).
struct Row {
  int arm = -1;  // -1: a value not seen yet (discover mode)
  std::optional<EventTime> sent, responded;
  bool late = false;
};

std::optional<Error> CheckRow(const CsvRecord& r, const Columns& c, const Target& t, const std::string& path, Row& out) {
  auto bad = [&](std::string what, std::string fix) {
    return BadInput(path + ":" + std::to_string(r.line), std::move(what), std::move(fix));
  };
  const std::string& arm = r.fields[c.arm];
  if (arm.empty())
    return bad("the arm is empty", t.arms.empty() ? "give every row the arm it was sent as" : "use one of: " + Join(t.arms));
  auto it = t.arm_of.find(arm);
  out.arm = it == t.arm_of.end() ? -1 : it->second;
  if (out.arm < 0 && !t.discover)
    return bad("unknown arm '" + arm + "'" + DidYouMean(arm, t.AcceptedArmValues()),
               "use one of the study's arms: " + Join(t.arms));
  const std::string& outcome = r.fields[c.outcome];
  if (outcome.empty()) return bad("the outcome is empty", t.open_codes ? "give every row its outcome" : OutcomeFix(t));
  if (t.open_codes) {
    // The codes are stored comma-joined (core/meta.h).
    if (outcome.find(',') != std::string::npos)
      return bad("outcome '" + outcome + "' holds a comma", "write outcome values without commas");
  } else if (t.staged && !t.scheme.has_code(outcome)) {
    return bad("outcome '" + outcome + "' is not one of the stages" + DidYouMean(outcome, t.scheme.codes),
               "write the furthest stage each application reached: " + Join(t.scheme.codes));
  } else if (!t.scheme.has_code(outcome))
    return bad("outcome '" + outcome + "' is not " + (t.has_design ? "a code of this study's scheme" : "1, 0 or a response code") +
                   // A one-letter value is one edit from "0" and "1": no useful guess.
                   (outcome.size() < 3 ? std::string() : DidYouMean(outcome, t.scheme.codes)),
               OutcomeFix(t));
  out.sent.reset();
  out.responded.reset();
  for (auto [col, name, slot] : {std::tuple{c.sent_at, "sent_at", &out.sent}, {c.responded_at, "responded_at", &out.responded}}) {
    if (col < 0 || r.fields[col].empty()) continue;
    *slot = ParseEventTime(r.fields[col]);
    if (!*slot) return bad(std::string(name) + " '" + Echoed(r.fields[col]) + "' " + WhyNotATime(r.fields[col], "is not a date or time"), kTimeFormat);
  }
  if (out.sent && out.responded && IsBefore(*out.responded, *out.sent))
    return bad("responded_at " + out.responded->text() + " is before sent_at " + out.sent->text(),
               "check the dates; a response cannot precede the application");
  out.late = out.sent && out.responded && IsAfterWindow(*out.sent, *out.responded, t.scheme.window_days);
  for (size_t i = 0; i < c.strata.size(); ++i)
    if (r.fields[c.strata[i]].empty())
      return bad("the stratum '" + t.strata[i] + "' is empty", "fill it in (use 'unknown' if it is not known)");
  // A missing covariate is refused rather than guessed: dropping the row
  // would change who is compared, and any filled-in value is a claim.
  for (size_t i = 0; i < c.covariates.size(); ++i)
    if (Trim(r.fields[c.covariates[i]]).empty())
      return BadInput(path + ":" + std::to_string(r.line) + ":" + std::to_string(c.covariates[i] + 1),
                      "the covariate '" + t.covariates[i] + "' is empty",
                      "fill it in; for a category not known write a category of its own such as 'unknown', or "
                      "leave the row out");
  if (c.probe >= 0 && r.fields[c.probe].empty())
    return bad("the probe is empty",
               "give every row a probe reference, or leave out the probe column to number the probes P00001, P00002, …");
  return std::nullopt;
}

// What pass 1 learns about each vacancy of the file, by dense index.
struct Book {
  std::unordered_map<std::string, uint32_t> index;
  std::vector<int64_t> first_good_line;          // 0 when no good row
  std::vector<int64_t> bad_line;                 // first bad row, 0 if none
  std::vector<std::vector<int64_t>> arm_line;    // [arm][vacancy]: its good row, 0 if none
  std::vector<std::vector<uint32_t>> stratum;    // [stratum][vacancy]: value id, kNone unset
  std::vector<uint32_t> employer;                // value id, kNone unset
  std::vector<int32_t> missing_arm;              // an arm without a row, -1 if none
  std::vector<Interner> stratum_values;
  Interner employers;
  // Good rows per stratum value and employer id, for the near-duplicate
  // warning (core/near_duplicates.h).
  std::vector<std::vector<int64_t>> stratum_rows;
  std::vector<int64_t> employer_rows;
  std::unordered_map<std::string, int64_t> probe_line;
  // Per covariate: whether every good row's cell is a number, and its
  // distinct values (kept up to one past kMaxCovariateCategories; the line
  // of the first value past it).
  std::vector<bool> covariate_numeric;
  std::vector<std::unordered_set<std::string>> covariate_values;
  std::vector<int64_t> covariate_overflow_line;

  uint32_t Add(const std::string& ref) {
    auto [it, inserted] = index.try_emplace(ref, static_cast<uint32_t>(bad_line.size()));
    if (inserted) {
      first_good_line.push_back(0);
      bad_line.push_back(0);
      for (auto& a : arm_line) a.push_back(0);
      for (auto& s : stratum) s.push_back(kNone);
      employer.push_back(kNone);
    }
    return it->second;
  }
  void AddArm() { arm_line.emplace_back(bad_line.size(), 0); }
  std::string RefOf(uint32_t v) const {
    for (const auto& [ref, i] : index)
      if (i == v) return ref;
    return "";
  }
};

struct BadRow {
  int64_t line;
  std::string reason;
};

// Pass 1: checks every row; with skip_bad collects the bad ones, else stops
// at the first.
class Checker {
 public:
  Checker(Target& t, const Columns& c, const std::string& path, bool skip_bad)
      : t_(t), c_(c), path_(path), skip_bad_(skip_bad) {
    book_.stratum_values.resize(c.strata.size());
    book_.stratum_rows.resize(c.strata.size());
    book_.stratum.resize(c.strata.size());
    book_.arm_line.assign(t.arms.size(), {});
    values_.resize(c.strata.size());
    book_.covariate_numeric.assign(c.covariates.size(), true);
    book_.covariate_values.resize(c.covariates.size());
    book_.covariate_overflow_line.assign(c.covariates.size(), 0);
  }

  // Returns an error to stop at (all-or-nothing), else records the row.
  std::optional<Error> Take(const CsvRecord& r) {
    ++rows_;
    uint32_t v = kNone;
    std::optional<Error> err;
    if (c_.stage_columns.empty()) {
      err = Examine(r, v);
    } else {
      staged_ = r;
      err = AppendStageOutcome(staged_, c_, t_, path_);
      if (!err) err = Examine(staged_, v);
    }
    if (!err) return std::nullopt;
    if (!skip_bad_) return err;
    bad_.push_back({r.line, err->what});
    if (v != kNone && book_.bad_line[v] == 0) book_.bad_line[v] = r.line;
    return std::nullopt;
  }

  // After the last row: arm typos, arm count, the reference, missing arms.
  std::optional<Error> Finish(const PairsImportOptions& o);

  int64_t rows() const { return rows_; }
  Book& book() { return book_; }
  std::vector<BadRow>& bad_rows() { return bad_; }

 private:
  std::optional<Error> Examine(const CsvRecord& r, uint32_t& v);
  Error At(int64_t line, std::string what, std::string fix) const {
    return BadInput(path_ + ":" + std::to_string(line), std::move(what), std::move(fix));
  }
  void DropArm(size_t a, const std::string& reason);

  Target& t_;
  const Columns& c_;
  const std::string& path_;
  bool skip_bad_;
  Book book_;
  std::vector<BadRow> bad_;
  std::vector<uint32_t> values_;  // the current row's strata value ids
  CsvRecord staged_;              // the current row with its derived outcome (stage columns)
  int64_t rows_ = 0;
};

std::optional<Error> Checker::Examine(const CsvRecord& r, uint32_t& v) {
  Status count = CheckFieldCount(r, c_.count + (c_.stage_columns.empty() ? 0 : 1), path_);
  if (!count.ok()) return count.error();
  const std::string ref = VacancyKey(r, c_);
  if (ref.empty()) return At(r.line, "the vacancy is empty", "give every row the reference of its vacancy");
  if (c_.vacancy >= 0 && t_.existing_vacancies.count(ref))
    return At(r.line, "vacancy '" + ref + "' is already in the study (from an earlier import)",
              "import only new vacancies; a corrected reject file can be imported as it is");
  v = book_.Add(ref);
  Row row;
  if (auto err = CheckRow(r, c_, t_, path_, row)) return err;
  if (t_.kind == "unpaired" && !t_.many_per_vacancy() && book_.first_good_line[v] != 0)
    return At(r.line,
              "vacancy '" + ref + "' has a second row (the first is on line " +
                  std::to_string(book_.first_good_line[v]) + ")",
              "an unpaired study sends one application per vacancy; keep one row per vacancy");
  if (row.arm >= 0 && !t_.many_per_vacancy() && book_.arm_line[row.arm][v] != 0)
    return At(r.line,
              "vacancy '" + ref + "' has a second row for arm '" + t_.arms[row.arm] + "' (the first is on line " +
                  std::to_string(book_.arm_line[row.arm][v]) + ")",
              "keep one row per vacancy and arm");
  std::vector<uint32_t>& values = values_;
  for (size_t i = 0; i < c_.strata.size(); ++i) {
    values[i] = book_.stratum_values[i].Id(r.fields[c_.strata[i]]);
    uint32_t known = book_.stratum[i][v];
    if (known != kNone && known != values[i])
      return At(r.line,
                "vacancy '" + ref + "' has " + t_.strata[i] + " '" + r.fields[c_.strata[i]] + "' here but '" +
                    book_.stratum_values[i].Name(known) + "' on line " + std::to_string(book_.first_good_line[v]),
                "a vacancy's strata are the same on all its rows");
  }
  uint32_t employer = kNone;
  if (c_.employer >= 0 && !r.fields[c_.employer].empty()) employer = book_.employers.Id(r.fields[c_.employer]);
  if (book_.first_good_line[v] != 0 && employer != book_.employer[v])
    return At(r.line,
              "vacancy '" + ref + "' has employer '" + (employer == kNone ? "" : book_.employers.Name(employer)) +
                  "' here but '" + (book_.employer[v] == kNone ? "" : book_.employers.Name(book_.employer[v])) +
                  "' on line " + std::to_string(book_.first_good_line[v]),
              "a vacancy has one employer on all its rows");
  if (t_.discover && t_.arms.size() == kMaxArms && row.arm < 0)
    return At(r.line, "a " + std::to_string(kMaxArms + 1) + "th distinct value '" + r.fields[c_.arm] + "' in the arm column",
              "is 'arm' the right column? it names the group of profiles each row was sent as (at most " +
                  std::to_string(kMaxArms) + " arms)");
  if (c_.probe >= 0) {  // the last check: a probe reference is taken only by a good row
    const std::string& probe = r.fields[c_.probe];
    if (t_.existing_probes.count(probe))
      return At(r.line, "probe '" + probe + "' is already in the study (from an earlier import)",
                "give each probe a reference not used before");
    auto [it, inserted] = book_.probe_line.try_emplace(probe, r.line);
    if (!inserted)
      return At(r.line, "probe '" + probe + "' appears twice (first on line " + std::to_string(it->second) + ")",
                "give each probe its own reference");
  }
  if (t_.open_codes && !t_.scheme.has_code(r.fields[c_.outcome])) {
    if (t_.scheme.codes.size() == kMaxArms)
      return At(r.line, "a " + std::to_string(kMaxArms + 1) + "th distinct value '" + r.fields[c_.outcome] +
                            "' in the outcome column",
                "is 'outcome' the right column? it holds each application's result (at most " +
                    std::to_string(kMaxArms) + " distinct values)");
    t_.scheme.codes.push_back(r.fields[c_.outcome]);
  }
  // The row is good: remember it.
  for (size_t i = 0; i < c_.covariates.size(); ++i) {
    const std::string value(Trim(r.fields[c_.covariates[i]]));
    if (!CovariateNumber(value)) book_.covariate_numeric[i] = false;
    std::unordered_set<std::string>& seen = book_.covariate_values[i];
    if (seen.size() <= kMaxCovariateCategories) seen.insert(value);
    if (seen.size() > kMaxCovariateCategories && book_.covariate_overflow_line[i] == 0)
      book_.covariate_overflow_line[i] = r.line;
  }
  for (size_t i = 0; i < c_.strata.size(); ++i) {
    std::vector<int64_t>& rows = book_.stratum_rows[i];
    if (rows.size() <= values[i]) rows.resize(values[i] + 1, 0);
    ++rows[values[i]];
  }
  if (employer != kNone) {
    if (book_.employer_rows.size() <= employer) book_.employer_rows.resize(employer + 1, 0);
    ++book_.employer_rows[employer];
  }
  if (row.arm < 0) {
    row.arm = static_cast<int>(t_.arms.size());
    t_.arms.push_back(r.fields[c_.arm]);
    t_.arm_of.emplace(r.fields[c_.arm], row.arm);
    t_.arm_rows.push_back(0);
    t_.arm_first_line.push_back(r.line);
    book_.AddArm();
  }
  ++t_.arm_rows[row.arm];
  book_.arm_line[row.arm][v] = r.line;
  if (book_.first_good_line[v] == 0) {
    book_.first_good_line[v] = r.line;
    for (size_t i = 0; i < values.size(); ++i) book_.stratum[i][v] = values[i];
    book_.employer[v] = employer;
  }
  return std::nullopt;
}

// A categorical covariate with more categories than the model can carry is
// refused (a numeric one may hold any number of values).
Result<std::vector<CovariateSummary>> SummariseCovariates(const Book& book, const Target& t, const Columns& c,
                                                          const std::string& path) {
  std::vector<CovariateSummary> out;
  for (size_t i = 0; i < t.covariates.size(); ++i) {
    CovariateSummary s;
    s.name = t.covariates[i];
    s.numeric = book.covariate_numeric[i];
    if (!s.numeric && book.covariate_overflow_line[i] != 0)
      return BadInput(path + ":" + std::to_string(book.covariate_overflow_line[i]) + ":" +
                          std::to_string(c.covariates[i] + 1),
                      "the covariate '" + s.name + "' has more than " + std::to_string(kMaxCovariateCategories) +
                          " categories (not every cell is a number, so it is read as categories)",
                      "group its values into fewer categories, or write every cell as a number");
    if (!s.numeric) s.categories = static_cast<int64_t>(book.covariate_values[i].size());
    out.push_back(s);
  }
  return out;
}

// --scores gives every group of a new study one score, and names no other.
std::optional<Error> CheckScores(const Target& t, const PairsImportOptions& o, const std::string& path) {
  if (o.scores.empty()) return std::nullopt;
  if (!t.discover)
    return BadInput("--scores", std::string("the groups' scores are set ") +
                                    (t.append ? "by the study's first import" : "in study.toml ([[factor]] scores)"),
                    "leave --scores out");
  for (const auto& [level, score] : o.scores)
    if (t.arm_of.find(level) == t.arm_of.end())
      return BadInput("--scores", "'" + level + "' is not a group of " + path + DidYouMean(level, t.arms),
                      "give scores to the groups of the file: " + Join(t.arms));
  for (const std::string& arm : t.arms) {
    bool scored = false;
    for (const auto& [level, score] : o.scores) scored = scored || level == arm;
    if (!scored)
      return BadInput("--scores", "the group '" + arm + "' has no score",
                      "give every group a score, e.g. --scores " + arm + "=NUMBER, or leave --scores out");
  }
  return std::nullopt;
}

void Checker::DropArm(size_t a, const std::string& reason) {
  for (size_t v = 0; v < book_.bad_line.size(); ++v) {
    int64_t line = book_.arm_line[a][v];
    if (line == 0) continue;
    bad_.push_back({line, reason});
    if (book_.bad_line[v] == 0 || line < book_.bad_line[v]) book_.bad_line[v] = line;
  }
  book_.arm_line.erase(book_.arm_line.begin() + static_cast<long>(a));
  t_.arms.erase(t_.arms.begin() + static_cast<long>(a));
  t_.arm_rows.erase(t_.arm_rows.begin() + static_cast<long>(a));
  t_.arm_first_line.erase(t_.arm_first_line.begin() + static_cast<long>(a));
  t_.IndexArms();
}

std::optional<Error> Checker::Finish(const PairsImportOptions& o) {
  if (rows_ == 0) return At(2, "the file has no data rows", "add one row per probe under the header");
  if (t_.discover && t_.arms.empty()) {  // every row is bad (only with skip_bad)
    book_.missing_arm.assign(book_.bad_line.size(), -1);
    std::stable_sort(bad_.begin(), bad_.end(), [](const BadRow& a, const BadRow& b) { return a.line < b.line; });
    return std::nullopt;
  }
  if (t_.discover) {
    // A rare value one typo away from a common one is a typo, not an arm:
    // left in, it would make every vacancy look incomplete.
    for (size_t a = 0; a < t_.arms.size();) {
      std::vector<std::string> common;
      for (size_t b = 0; b < t_.arms.size(); ++b)
        if (b != a && t_.arm_rows[b] >= 2 * t_.arm_rows[a]) common.push_back(t_.arms[b]);
      std::string near = NearestName(t_.arms[a], common);
      if (near.empty()) {
        ++a;
        continue;
      }
      const std::string what = "unknown arm '" + t_.arms[a] + "' (did you mean '" + near + "'?)";
      int64_t n = t_.arm_rows[a], m = t_.arm_rows[static_cast<size_t>(t_.arm_of.at(near))];
      if (!skip_bad_)
        return At(t_.arm_first_line[a], what,
                  "'" + t_.arms[a] + "' is on " + std::to_string(n) + (n == 1 ? " row" : " rows") + " and '" + near +
                      "' on " + std::to_string(m) + "; correct the typo");
      DropArm(a, what);
    }
    if (t_.arms.size() < 2)
      return BadInput(path_,
                      bad_.empty() ? "the arm column holds only one arm ('" + t_.arms[0] + "')"
                                   : "only one arm ('" + t_.arms[0] + "') is left once the bad rows are set aside",
                      "a comparison needs at least two arms; check the arm column");
    if (o.reference.empty())
      return BadInput("", "the reference arm is not named",
                      "add --reference ARM; the arms in " + path_ + " are " + Quoted(t_.arms));
    auto it = t_.arm_of.find(o.reference);
    if (it == t_.arm_of.end())
      return BadInput("", "--reference '" + o.reference + "' is not an arm of " + path_ + DidYouMean(o.reference, t_.arms),
                      "use one of: " + Join(t_.arms));
    // Reference first, the others in order of appearance.
    size_t ref = static_cast<size_t>(it->second);
    std::rotate(t_.arms.begin(), t_.arms.begin() + static_cast<long>(ref), t_.arms.begin() + static_cast<long>(ref) + 1);
    std::rotate(t_.arm_rows.begin(), t_.arm_rows.begin() + static_cast<long>(ref), t_.arm_rows.begin() + static_cast<long>(ref) + 1);
    std::rotate(t_.arm_first_line.begin(), t_.arm_first_line.begin() + static_cast<long>(ref),
                t_.arm_first_line.begin() + static_cast<long>(ref) + 1);
    std::rotate(book_.arm_line.begin(), book_.arm_line.begin() + static_cast<long>(ref),
                book_.arm_line.begin() + static_cast<long>(ref) + 1);
    t_.reference = 0;
    t_.IndexArms();
    if (o.kind.empty()) t_.kind = t_.arms.size() == 2 ? "paired" : "sets";
    if (t_.kind == "paired" && t_.arms.size() != 2)
      return BadInput("", "--kind paired compares two groups, but the arm column holds " +
                              std::to_string(t_.arms.size()) + ": " + Quoted(t_.arms),
                      "use --kind sets (one application of each group per vacancy) or --kind unpaired");
  }
  if (t_.open_codes)
    for (const std::string& value : t_.scheme.positive)
      if (!t_.scheme.has_code(value))
        return BadInput("", "--positive '" + value + "' is not a value of the outcome column" +
                                DidYouMean(value, t_.scheme.codes),
                        "the outcome column of " + path_ + " holds " + Quoted(t_.scheme.codes));
  // Every remaining vacancy needs one row per arm (an unpaired study has
  // one row per vacancy, checked row by row).
  book_.missing_arm.assign(book_.bad_line.size(), -1);
  if (t_.kind == "unpaired") {
    std::stable_sort(bad_.begin(), bad_.end(), [](const BadRow& a, const BadRow& b) { return a.line < b.line; });
    return std::nullopt;
  }
  int64_t first_line = 0;
  uint32_t first_v = kNone;
  for (uint32_t v = 0; v < book_.bad_line.size(); ++v) {
    if (book_.bad_line[v] != 0) continue;
    for (size_t a = 0; a < t_.arms.size(); ++a)
      if (book_.arm_line[a][v] == 0) {
        book_.missing_arm[v] = static_cast<int32_t>(a);
        if (first_v == kNone || book_.first_good_line[v] < first_line) first_v = v, first_line = book_.first_good_line[v];
        break;
      }
  }
  if (first_v != kNone && !skip_bad_)
    return At(first_line,
              "vacancy '" + book_.RefOf(first_v) + "' has no row for arm '" +
                  t_.arms[static_cast<size_t>(book_.missing_arm[first_v])] + "'",
              "every vacancy needs one row per arm (" + Join(t_.arms) + "); add the missing row or remove the vacancy");
  std::stable_sort(bad_.begin(), bad_.end(), [](const BadRow& a, const BadRow& b) { return a.line < b.line; });
  return std::nullopt;
}

// Pass 2: the good rows into the store, under one audit entry. Row ids are
// assigned here (the transaction holds the write lock) so probes, their
// sendings and responses can be written in batches of kBatch probes, parents
// first, under the usual immediate foreign-key checks.
class Lander {
 public:
  static constexpr int kBatch = 64;

  Lander(Store& store, const Target& t, const Columns& c, size_t vacancies, int64_t seq, const std::string& actor,
         const std::string& at, int64_t plan_id, std::vector<int64_t> arm_ids)
      : store_(store), t_(t), c_(c), arm_ids_(std::move(arm_ids)), serial_(t.next_serial),
        vacancy_id_(vacancies, 0), probes_in_(vacancies, 0),
        writer_(store, plan_id, seq, actor, at, kBatch, static_cast<int>(c.strata.size()),
                static_cast<int>(c.covariates.size())),
        next_vacancy_id_(writer_.next_vacancy_id()), next_probe_id_(writer_.next_probe_id()) {}

  void Land(const CsvRecord& r, uint32_t v, const Row& row, PairsImportSummary& summary) {
    std::string probe_ref;
    if (c_.probe >= 0) {
      probe_ref = r.fields[c_.probe];
    } else {
      char ref[24];
      int n = std::snprintf(ref, sizeof ref, "P%05lld", static_cast<long long>(serial_++));
      probe_ref.assign(ref, static_cast<size_t>(n));
    }
    if (vacancy_id_[v] == 0) {
      vacancy_id_[v] = next_vacancy_id_++;
      // Without a vacancy column each application is a vacancy of its own,
      // under the application's reference.
      writer_.AddVacancy(vacancy_id_[v], c_.vacancy >= 0 ? r.fields[c_.vacancy] : probe_ref, EmployerOf(r));
      for (size_t i = 0; i < c_.strata.size(); ++i) writer_.AddStratum(vacancy_id_[v], t_.strata[i], r.fields[c_.strata[i]]);
      ++summary.vacancies_landed;
    }
    const int64_t probe_id = next_probe_id_++;
    writer_.AddProbe(probe_id, probe_ref, vacancy_id_[v], arm_ids_[static_cast<size_t>(row.arm)], ++probes_in_[v]);
    if (row.sent) {
      writer_.AddSending(probe_id, CanonicalEventText(r.fields[c_.sent_at]));
      ++summary.sendings;
    }
    for (size_t i = 0; i < c_.covariates.size(); ++i)
      writer_.AddCovariate(probe_id, t_.covariates[i], Trim(r.fields[c_.covariates[i]]));
    writer_.AddResponse(probe_id, r.fields[c_.outcome],
                        row.responded ? CanonicalEventText(r.fields[c_.responded_at]) : std::string(), row.late);
    writer_.EndProbe();
    if (row.late) ++summary.late;
    ++summary.rows_landed;
  }

  // Writes what is buffered, parents before children.
  void Finish() { writer_.Finish(); }

 private:
  std::string EmployerOf(const CsvRecord& r) {
    if (c_.employer < 0 || r.fields[c_.employer].empty()) return "";
    const std::string& name = r.fields[c_.employer];
    auto it = employer_keys_.find(name);
    if (it == employer_keys_.end()) {
      it = employer_keys_.emplace(name, EmployerKey(store_, name)).first;
      writer_.AddEmployer(it->second, name);
    }
    return it->second;
  }

  Store& store_;
  const Target& t_;
  const Columns& c_;
  std::vector<int64_t> arm_ids_;
  int64_t serial_;
  std::vector<int64_t> vacancy_id_;
  std::vector<int64_t> probes_in_;
  PairsWriter writer_;
  int64_t next_vacancy_id_, next_probe_id_;
  std::unordered_map<std::string, std::string> employer_keys_;
};

// The design a new imported plan is stored with.
Design HeaderDesign(const Design* design, const Target& t, const std::string& store_path, const std::string& path,
                    const PairsImportOptions& o) {
  Design d;
  if (design) {
    d = *design;
    d.strata = t.strata;
    return d;
  }
  d.study_id = o.study_id.empty() ? fs::absolute(store_path).parent_path().filename().string() : o.study_id;
  d.title = "Data imported from " + fs::path(path).filename().string();
  d.seed = 0;
  d.kind = t.kind;
  Factor f;
  f.name = o.factor.empty() ? "arm" : o.factor;
  f.levels = t.arms;
  f.reference = t.arms[static_cast<size_t>(t.reference)];
  for (const std::string& level : f.levels)  // in the levels' order (CheckScores: one each)
    for (const auto& [name, score] : o.scores)
      if (name == level) f.scores.push_back(score);
  d.factors = {f};
  d.arms.clear();
  for (size_t i = 0; i < t.arms.size(); ++i)
    d.arms.push_back(Arm{t.arms[i], {{f.name, t.arms[i]}}, static_cast<int>(i) == t.reference});
  d.reference_arm = t.reference;
  d.outcomes = t.scheme;
  d.strata = t.strata;
  return d;
}

// The header under the importer's own names: each column that --columns
// maps to a role (arm=group) is read as that role.
Result<std::vector<std::string>> RoleHeader(const std::vector<std::string>& file_header, const PairsImportOptions& o,
                                            const std::string& path) {
  std::vector<std::string> header = file_header;
  for (const auto& [role, column] : o.column_names) {
    int i = FindColumn(file_header, column);
    if (i < 0)
      return BadInput(path + ":1", "the column '" + column + "' named by --columns " + role + "=" + column +
                                       " is missing" + DidYouMean(column, file_header),
                      "name one of the file's columns: " + Quoted(file_header));
    int own = FindColumn(file_header, role);
    if (own >= 0 && own != i)
      return BadInput(path + ":1", "the file has a column '" + role + "' of its own, and --columns maps '" + column +
                                       "' to " + role,
                      "leave " + role + "= out of --columns, or rename one of the two columns");
    header[static_cast<size_t>(i)] = role;
  }
  return header;
}

std::string PartnerReason(const std::string& ref, int64_t bad_line) {
  return "another row of vacancy '" + ref + "' (line " + std::to_string(bad_line) +
         ") is bad, so the whole set is left out";
}

// Spellings of one value that differ only in case or spaces, among the
// good rows' strata, employers and (when the file names the arms) arms.
std::vector<NearDuplicate> NearDuplicatesOf(const Book& book, const Target& t) {
  SpellingTally tally;
  for (size_t i = 0; i < book.stratum_rows.size(); ++i)
    for (uint32_t id = 0; id < book.stratum_rows[i].size(); ++id)
      if (book.stratum_rows[i][id] > 0) tally.Add(t.strata[i], book.stratum_values[i].Name(id), book.stratum_rows[i][id]);
  for (uint32_t id = 0; id < book.employer_rows.size(); ++id)
    if (book.employer_rows[id] > 0) tally.Add("employer", book.employers.Name(id), book.employer_rows[id]);
  if (t.discover)
    for (size_t a = 0; a < t.arms.size(); ++a) tally.Add("arm", t.arms[a], t.arm_rows[a]);
  return tally.NearDuplicates();
}

}  // namespace

Result<PairsImportSummary> ImportPairs(const std::string& store_path, const Design* design, const std::string& path,
                                       const PairsImportOptions& o) {
  PairsImportSummary summary;
  // The same rule as [study].id: the id names files and folders (reports,
  // exports), so a path such as ../../evil must never become one.
  if (!o.study_id.empty()) {
    bool ok = o.study_id != "." && o.study_id != ".." && o.study_id.size() <= 100;
    for (char c : o.study_id)
      ok = ok && (std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == '.');
    if (!ok)
      return BadInput("--id", "the study id may hold only letters, digits, '-', '_' and '.' (at most 100 of them)",
                      "choose an id such as veldmark-2027");
  }
  auto sha = FileSha256(path);
  if (!sha.ok()) return sha.error();
  std::unique_ptr<Store> store;
  ImportLock lock;  // held until the import ends: appends check and land one at a time
  if (fs::exists(store_path)) {
    auto held = AcquireImportLock(store_path);
    if (!held.ok()) return held.error();
    lock = std::move(held).value();
    auto opened = Store::Open(store_path, false);
    if (!opened.ok()) return opened.error();
    store = std::move(opened).value();
    if (AlreadyImported(*store, "pairs", sha.value())) {
      summary.already_imported = true;
      return summary;
    }
  }
  auto target = BuildTarget(store.get(), design, o);
  if (!target.ok()) return target.error();
  Target& t = target.value();

  // Pass 1: check.
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  CsvReader reader(in, path);
  auto header = ReadCsvHeader(reader);
  if (!header.ok()) return header.error();
  auto roles = RoleHeader(header.value(), o, path);
  if (!roles.ok()) return roles.error();
  auto columns = FindColumns(roles.value(), header.value(), t, path, summary.ignored_columns);
  if (!columns.ok()) return columns.error();
  const Columns& c = columns.value();
  const int64_t file_bytes = FileSize(path);
  Checker checker(t, c, path, o.skip_bad);
  {
    std::unique_ptr<Progress> bar;
    if (o.progress) bar = std::make_unique<Progress>("checking " + path, file_bytes, Progress::Unit::kBytes);
    CsvRecord r;
    while (reader.Next(r)) {
      if (auto err = checker.Take(r)) return *err;
      if (bar) bar->Update(reader.bytes_consumed());
    }
    if (reader.error()) return *reader.error();  // a malformed CSV fails even with --skip-bad
    if (bar) bar->Update(file_bytes);
  }
  if (auto err = checker.Finish(o)) return *err;
  Book& book = checker.book();
  if (auto err = CheckScores(t, o, path)) return *err;
  auto covariates = SummariseCovariates(book, t, c, path);
  if (!covariates.ok()) return covariates.error();
  summary.covariates = covariates.value();
  summary.near_duplicates = NearDuplicatesOf(book, t);
  bool any_good = false;
  for (size_t v = 0; v < book.bad_line.size() && !any_good; ++v)
    any_good = book.bad_line[v] == 0 && book.missing_arm[v] < 0;

  // Pass 2: land the good rows (or, when none is good, only write the rejects).
  if (!store) {
    if (any_good) {
      fs::create_directories(fs::absolute(store_path).parent_path());
      auto created = Store::Open(store_path, true);
      if (!created.ok()) return created.error();
      store = std::move(created).value();
    }
  }
  std::unique_ptr<AuditedWrite> write;
  std::unique_ptr<Lander> lander;
  if (any_good) {
    write = std::make_unique<AuditedWrite>(*store, o.records ? "import applications" : "import pairs");
    if (AlreadyImported(*store, "pairs", sha.value())) {  // another process was quicker
      summary.already_imported = true;
      return summary;
    }
    auto current = ReadImportPlan(*store);
    if ((current ? current->id : 0) != t.plan_id || (t.append && 1 + MaxProbeSerial(*store) != t.next_serial))
      return BadInput(store_path, "the study changed while the file was checked", "run the import again");
    std::vector<int64_t> arm_ids = t.arm_ids;
    int64_t plan_id = t.plan_id;
    if (!t.append) {
      plan_id = StorePlanHeader(*store, write->seq(), "import", HeaderDesign(design, t, store_path, path, o), arm_ids);
      // What the rows are: the report words a study of records differently.
      if (o.records) StoreMetaValue(*store, write->seq(), "data", "applications");
      if (!o.stages.empty()) StoreMetaValue(*store, write->seq(), "stages", Join(o.stages, ","));
      if (!t.covariates.empty()) StoreMetaValue(*store, write->seq(), "covariates", Join(t.covariates, ","));
      summary.new_plan = true;
    }
    summary.plan_id = plan_id;
    lander = std::make_unique<Lander>(*store, t, c, book.bad_line.size(), write->seq(), write->actor(), write->at(),
                                      plan_id, arm_ids);
  }
  RejectWriter rejects(o.reject_path.empty() ? DefaultRejectPath(path) : o.reject_path, header.value(), path,
                       o.raw_cells);
  {
    std::ifstream again(path, std::ios::binary);
    CsvReader pass2(again, path);
    auto header2 = ReadCsvHeader(pass2);
    if (!header2.ok()) return header2.error();
    std::unique_ptr<Progress> bar;
    if (o.progress) bar = std::make_unique<Progress>("importing " + path, file_bytes, Progress::Unit::kBytes);
    const std::vector<BadRow>& bad = checker.bad_rows();
    size_t next_bad = 0;
    CsvRecord r, staged;
    Row row;
    while (pass2.Next(r)) {
      if (bar) bar->Update(pass2.bytes_consumed());
      Status status;
      if (next_bad < bad.size() && bad[next_bad].line == r.line) {
        status = rejects.Add(r.line, bad[next_bad++].reason, r.fields);
      } else {
        const std::string ref = VacancyKey(r, c);
        auto it = book.index.find(ref);
        const CsvRecord* use = &r;
        if (!c.stage_columns.empty()) {
          staged = r;
          if (AppendStageOutcome(staged, c, t, path))
            return Internal("import pairs: " + path + ":" + std::to_string(r.line) + " changed between the two passes");
          use = &staged;
        }
        if (it == book.index.end() || CheckRow(*use, c, t, path, row) || row.arm < 0)
          return Internal("import pairs: " + path + ":" + std::to_string(r.line) + " changed between the two passes");
        uint32_t v = it->second;
        if (book.bad_line[v] != 0)
          status = rejects.Add(r.line, PartnerReason(ref, book.bad_line[v]), r.fields);
        else if (book.missing_arm[v] >= 0)
          status = rejects.Add(r.line, "vacancy '" + ref + "' has no row for arm '" +
                                           t.arms[static_cast<size_t>(book.missing_arm[v])] + "'",
                               r.fields);
        else
          lander->Land(*use, v, row, summary);
      }
      if (!status.ok()) return status.error();
    }
    if (pass2.error()) return *pass2.error();
    if (bar) bar->Update(file_bytes);
  }
  if (lander) lander->Finish();
  Status closed = rejects.Close();
  if (!closed.ok()) return closed.error();
  summary.rows_rejected = rejects.rows();
  if (summary.rows_rejected) summary.reject_path = rejects.path();
  if (!any_good)
    return BadInput(path, "no row of the file can be imported",
                    "see the reasons in " + rejects.path() + "; nothing was written to the store");
  summary.kind = t.kind;
  summary.arms = t.arms;
  if (t.reference > 0) std::rotate(summary.arms.begin(), summary.arms.begin() + t.reference, summary.arms.begin() + t.reference + 1);
  summary.strata = t.strata;
  summary.positive = t.scheme.positive;
  summary.factor = design ? "" : (o.factor.empty() ? "arm" : o.factor);
  RecordImportFile(*store, write->seq(), "pairs", sha.value(), path, summary.rows_landed, summary.rows_rejected);
  summary.audit_hash = write->Commit(std::string(o.records ? "import applications " : "import pairs ") + path + ": " +
                                     std::to_string(summary.rows_landed) + " " + RowNoun(o.records) + "s in " +
                                     std::to_string(summary.vacancies_landed) + " vacancies landed, " +
                                     std::to_string(summary.rows_rejected) + " rows rejected");
  return summary;
}

}  // namespace twinprobe
