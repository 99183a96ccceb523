#include "analysis/deviations.h"

#include <algorithm>
#include <cstdio>
#include <map>

#include "core/sha256.h"

namespace twinprobe {
namespace {

std::map<std::string, std::string> ParsePlanLines(const std::string& text) {
  std::map<std::string, std::string> out;
  size_t pos = 0;
  while (pos < text.size()) {
    size_t end = text.find('\n', pos);
    if (end == std::string::npos) end = text.size();
    std::string line = text.substr(pos, end - pos);
    size_t eq = line.find('=');
    if (eq != std::string::npos) out[line.substr(0, eq)] = line.substr(eq + 1);
    pos = end + 1;
  }
  return out;
}

std::vector<std::string> Split(const std::string& s, char sep) {
  std::vector<std::string> out;
  if (s.empty()) return out;
  size_t start = 0;
  for (;;) {
    size_t at = s.find(sep, start);
    out.push_back(s.substr(start, at - start));
    if (at == std::string::npos) break;
    start = at + 1;
  }
  return out;
}

std::string Short(const std::string& sha) { return sha.substr(0, 12) + "…"; }

std::string Shown(const std::string& v) { return v.empty() ? "(none)" : v; }

// The analysis plan items in use now: from the design when there is one,
// else from what the store remembers; alpha, correction and primary from the
// plan the analysis runs with.
std::map<std::string, std::string> CurrentItems(const StoredDesign& stored, const Fieldwork& fieldwork,
                                                const Design* current, const AnalysisPlan& used) {
  std::map<std::string, std::string> items;
  if (current) {
    items = ParsePlanLines(CanonicalAnalysisPlan(*current));
  } else {
    auto join = [](const std::vector<std::string>& v, const char* sep) {
      std::string s;
      for (size_t i = 0; i < v.size(); ++i) s += (i ? sep : "") + v[i];
      return s;
    };
    const OutcomeScheme& scheme = stored.scheme;
    items["codes"] = join(scheme.codes, ",");
    items["positive"] = join(scheme.positive, ",");
    items["window_days"] = std::to_string(scheme.window_days);
    items["strata"] = join(stored.strata_columns, ",");
    if (fieldwork.has_plan) items["kind"] = fieldwork.kind;
    // Arms in the order they were stored (by id), as the canonical plan lists them.
    std::vector<FieldworkArm> by_id = fieldwork.arms;
    std::sort(by_id.begin(), by_id.end(), [](const FieldworkArm& x, const FieldworkArm& y) { return x.id < y.id; });
    std::vector<std::string> arms;
    std::string reference;
    for (const auto& a : by_id) {
      arms.push_back(a.label);
      if (a.is_reference) reference = a.label;
    }
    if (!arms.empty()) items["arms"] = join(arms, "|"), items["reference"] = reference;
  }
  char alpha[40];
  std::snprintf(alpha, sizeof alpha, "%.17g", used.alpha);
  items["alpha"] = alpha;
  items["correction"] = used.correction;
  items["primary"] = used.primary;
  return items;
}

// The study.toml key an analysis-plan item comes from.
std::string DesignKeyOf(const std::string& item) {
  if (item == "primary") return "[analysis].primary";
  if (item == "positive" || item == "codes" || item == "window_days") return "[outcomes]." + item;
  if (item == "kind") return "[study].kind";
  if (item == "reference") return "[[factor]].reference";
  return "[arms]";
}

std::string RoleName(const std::string& role) {
  if (role == "vacancies") return "the vacancy file";
  if (role == "name_pool") return "a name pool";
  if (role == "template") return "a template";
  return "the design file";
}

// "3 removed (V0201, V0202, V0203)" — at most five keys named, then how many more.
std::string KeyList(const std::vector<std::string>& keys, const char* verb) {
  std::string s = std::to_string(keys.size()) + " " + verb + " (";
  for (size_t i = 0; i < keys.size() && i < 5; ++i) s += (i ? ", " : "") + keys[i];
  if (keys.size() > 5) s += " and " + std::to_string(keys.size() - 5) + " more";
  return s + ")";
}

// What changed in one file, record by record: the sentence part
// ("2 changed (line 3, line 7), 200 removed (V0201, …)") and the keys.
struct FileChanges {
  std::string text;
  std::vector<std::string> keys;
};

FileChanges CompareRecords(const FrozenInput& before, const FrozenInput& after) {
  std::map<std::string, std::string> then(before.records.begin(), before.records.end());
  std::map<std::string, std::string> now(after.records.begin(), after.records.end());
  std::vector<std::string> removed, added, changed;
  for (const auto& [k, v] : before.records)
    if (!now.count(k)) removed.push_back(k);
    else if (now.at(k) != v) changed.push_back(k);
  for (const auto& [k, v] : after.records)
    if (!then.count(k)) added.push_back(k);
  FileChanges out;
  auto add = [&](const std::vector<std::string>& v, const char* verb) {
    if (v.empty()) return;
    out.text += (out.text.empty() ? "" : ", ") + KeyList(v, verb);
    out.keys.insert(out.keys.end(), v.begin(), v.end());
  };
  add(changed, "changed");
  add(removed, "removed");
  add(added, "added");
  return out;
}

const FrozenInput* FindInput(const std::vector<FrozenInput>& v, const FrozenInput& f) {
  for (const FrozenInput& x : v)
    if (x.role == f.role && x.file == f.file) return &x;
  return nullptr;
}

// Each input file of the freeze but the design (design_edited names its
// keys) against the same file now.
void CompareInputs(const std::vector<FrozenInput>& frozen, const std::vector<FrozenInput>& now,
                   std::vector<Deviation>& out, std::vector<ExploratoryItem>& exploratory) {
  for (const FrozenInput& f : frozen) {
    if (f.role == "design") continue;
    const FrozenInput* cur = FindInput(now, f);
    if (!cur) {
      out.push_back({"input_removed", f.file + " (" + RoleName(f.role) + ") was frozen but the design no longer names it",
                     f.file, {}});
      exploratory.push_back({"every comparison between arms", f.file + " was frozen and is no longer used"});
      continue;
    }
    if (cur->sha256 == f.sha256) continue;
    const FileChanges c = CompareRecords(f, *cur);
    // Bytes changed but no record the analysis reads (e.g. `purge` rewrote
    // the vacancy file's employer column): not a deviation.
    if (!cur->sha256.empty() && c.keys.empty()) continue;
    out.push_back({"input_changed",
                   f.file + " (" + RoleName(f.role) + ") changed after the freeze" +
                       (cur->sha256.empty() ? ": it cannot be read now" : c.text.empty() ? "" : ": " + c.text),
                   f.file, c.keys});
    exploratory.push_back({f.role == "vacancies" ? "every result" : "every comparison between arms",
                           f.file + " differs from the frozen " + (f.role == "vacancies" ? "vacancy list" : "materials")});
  }
  for (const FrozenInput& f : now)
    if (f.role != "design" && !FindInput(frozen, f)) {
      out.push_back({"input_added", f.file + " (" + RoleName(f.role) + ") is named by the design but was not frozen",
                     f.file, {}});
      exploratory.push_back({"every comparison between arms", f.file + " was not part of the frozen inputs"});
    }
}

// The design file's changed keys.
FileChanges DesignKeysChanged(const std::vector<FrozenInput>& frozen, const std::vector<FrozenInput>& now) {
  for (const FrozenInput& f : frozen)
    if (f.role == "design")
      if (const FrozenInput* cur = FindInput(now, f)) return CompareRecords(f, *cur);
  return {};
}

}  // namespace

bool PreregistrationStatus::IsExploratoryStratum(const std::string& stratum) const {
  return frozen && std::find(frozen_strata.begin(), frozen_strata.end(), stratum) == frozen_strata.end();
}

PreregistrationStatus CheckPreregistration(const std::optional<FreezeRecord>& freeze, const StoredDesign& stored,
                                           const Fieldwork& fieldwork, const Design* current, const AnalysisPlan& used,
                                           const std::vector<StoredLook>& looks) {
  PreregistrationStatus s;
  if (current) {
    s.current_design_sha256 = Sha256Hex(current->canonical);
    s.current_analysis_sha256 = Sha256Hex(CanonicalAnalysisPlan(*current));
  }
  if (!freeze) return s;
  s.frozen = true;
  s.frozen_at = freeze->at;
  s.design_sha256 = freeze->design_sha256;
  s.analysis_sha256 = freeze->analysis_sha256;
  const auto frozen = ParsePlanLines(freeze->analysis_plan);
  const auto now = CurrentItems(stored, fieldwork, current, used);
  auto frozen_item = [&](const std::string& key) {
    auto it = frozen.find(key);
    return it == frozen.end() ? std::string() : it->second;
  };
  s.frozen_strata = Split(frozen_item("strata"), ',');

  const bool inputs_compared = current && !current->inputs.empty() && !freeze->inputs.empty();
  const std::vector<FrozenInput> frozen_inputs = inputs_compared ? ParseInputs(freeze->inputs) : std::vector<FrozenInput>{};
  const std::vector<FrozenInput> current_inputs = inputs_compared ? ParseInputs(current->inputs) : std::vector<FrozenInput>{};
  if (current && s.current_design_sha256 != s.design_sha256) {
    const FileChanges c = DesignKeysChanged(frozen_inputs, current_inputs);
    s.deviations.push_back({"design_edited", "study.toml was edited after the freeze" +
                                                 (c.text.empty() ? std::string() : ": " + c.text) +
                                                 " (frozen design sha256 " + Short(s.design_sha256) + ", now " +
                                                 Short(s.current_design_sha256) + ")",
                            "study.toml", c.keys});
  }
  // An imported plan has no design hash (stored as NULL, read as "").
  if (fieldwork.has_plan && !fieldwork.design_sha256.empty() && fieldwork.design_sha256 != s.design_sha256)
    s.deviations.push_back({"plan_from_other_design", "the current plan was made from a design other than the frozen one "
                                                      "(plan design sha256 " + Short(fieldwork.design_sha256) + ")",
                            "", {}});
  const int64_t sent_before = freeze->sent_before;
  const int64_t responses_before = freeze->responses_before;
  if (sent_before > 0 || responses_before > 0)
    s.deviations.push_back({"frozen_after_fieldwork", "the design was frozen after " + std::to_string(sent_before) +
                                                          " probes were sent and " + std::to_string(responses_before) +
                                                          " responses recorded, so the registration is not prospective",
                            "", {}});

  auto differs = [&](const std::string& key) { return now.count(key) && now.at(key) != frozen_item(key); };
  // Strata, item by item.
  if (now.count("strata")) {
    auto current_strata = Split(now.at("strata"), ',');
    for (const auto& x : current_strata)
      if (std::find(s.frozen_strata.begin(), s.frozen_strata.end(), x) == s.frozen_strata.end()) {
        s.deviations.push_back({"stratum_added", "stratum '" + x + "' was added after the freeze", "study.toml",
                                {"[strata].columns"}});
        s.exploratory.push_back({"results by stratum '" + x + "'", "the stratum is not in the frozen plan"});
      }
    for (const auto& x : s.frozen_strata)
      if (std::find(current_strata.begin(), current_strata.end(), x) == current_strata.end())
        s.deviations.push_back({"stratum_removed", "stratum '" + x + "' of the frozen plan was removed", "study.toml",
                                {"[strata].columns"}});
  }
  if (differs("correction")) {
    s.deviations.push_back({"correction_changed", "the multiple-comparison correction is " + Shown(now.at("correction")) +
                                                      "; the frozen plan names " + Shown(frozen_item("correction")),
                            "study.toml", {"[analysis].correction"}});
    s.exploratory.push_back({"p-values adjusted by " + now.at("correction"),
                             "the frozen plan names " + Shown(frozen_item("correction"))});
  }
  if (differs("alpha")) {
    s.deviations.push_back({"alpha_changed", "alpha is " + now.at("alpha") + "; the frozen plan names " + frozen_item("alpha"),
                            "study.toml", {"[analysis].alpha"}});
    s.exploratory.push_back({"conclusions at alpha = " + now.at("alpha"), "the frozen plan names alpha = " + frozen_item("alpha")});
  }
  for (const char* key : {"primary", "positive", "codes", "window_days"})
    if (differs(key)) {
      s.deviations.push_back({"primary_outcome_changed", std::string(key) + " is " + Shown(now.at(key)) +
                                                             "; the frozen plan says " + Shown(frozen_item(key)),
                              "study.toml", {DesignKeyOf(key)}});
      s.exploratory.push_back({"the primary outcome as now defined", std::string("its ") + key + " differs from the frozen plan"});
    }
  for (const char* key : {"kind", "arms", "reference"})
    if (differs(key)) {
      s.deviations.push_back({"arms_changed", std::string(key) + " is " + Shown(now.at(key)) +
                                                  "; the frozen plan says " + Shown(frozen_item(key)),
                              "study.toml", {DesignKeyOf(key)}});
      s.exploratory.push_back({"every comparison between arms", std::string("the ") + key + " differs from the frozen plan"});
    }
  if (differs("looks")) {
    s.deviations.push_back({"looks_changed", "the planned interim looks are " + Shown(now.at("looks")) +
                                                 "; the frozen plan says " + Shown(frozen_item("looks")),
                            "study.toml", {"[analysis].looks"}});
    s.exploratory.push_back({"the monitoring decisions", "the looks differ from the frozen monitoring plan"});
  }
  if (differs("spending")) {
    s.deviations.push_back({"spending_changed", "the spending function is " + Shown(now.at("spending")) +
                                                    "; the frozen plan says " + Shown(frozen_item("spending")),
                            "study.toml", {"[analysis].spending"}});
    s.exploratory.push_back({"the monitoring decisions", "the spending function differs from the frozen monitoring plan"});
  }
  // A look taken with another spending function (monitor --spending).
  const std::string frozen_spending = frozen_item("spending");
  for (const StoredLook& l : looks)
    if (!frozen_spending.empty() && l.spending != frozen_spending) {
      s.deviations.push_back({"monitor_spending", "monitor look " + std::to_string(l.look) + " (" + l.taken_at +
                                                      ") used " + l.spending + " spending; the frozen plan says " +
                                                      frozen_spending,
                              "", {"look " + std::to_string(l.look)}});
      s.exploratory.push_back({"the monitoring decisions", "a look used a spending function other than the frozen one"});
    }
  CompareInputs(frozen_inputs, current_inputs, s.deviations, s.exploratory);
  // One exploratory entry per result, however many of its items changed.
  std::vector<ExploratoryItem> unique;
  for (auto& e : s.exploratory)
    if (std::none_of(unique.begin(), unique.end(), [&](const ExploratoryItem& u) { return u.what == e.what; }))
      unique.push_back(std::move(e));
  s.exploratory = std::move(unique);
  return s;
}

}  // namespace twinprobe
