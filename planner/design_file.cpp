#include "planner/design_file.h"
#include "planner/freeze_inputs.h"

#include <toml++/toml.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <stdexcept>

#include "core/clock.h"
#include "core/echoed_value.h"
#include "core/suggest.h"
#include "planner/mail_section.h"
#include "planner/monitorable.h"
#include "planner/name_pools.h"
#include "planner/profiles.h"
#include "planner/send_calendar.h"
#include "planner/set_groups.h"
#include "planner/source_section.h"
#include "planner/toml_list.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

// The keys of one section, from the single list below; a section missing from
// it is a programming error, so it fails loudly in tests.
const std::vector<std::string>& KeysOf(const std::string& section) {
  for (const auto& s : KnownDesignKeys())
    if (s.section == section) return s.keys;
  throw std::logic_error("no known keys for " + section);
}

// Walks the parsed TOML and turns every problem into one positioned error.
class DesignReader : public TomlErrorSink {
 public:
  DesignReader(const toml::table& root, std::string label, std::string study_dir)
      : root_(root), label_(std::move(label)), dir_(std::move(study_dir)) {}

  Result<Design> Read();

 private:
  std::string Where(const toml::node* node) const {
    if (!node) return label_;
    const auto& b = node->source().begin;
    return label_ + ":" + std::to_string(b.line) + ":" + std::to_string(b.column);
  }
  SourcePos Pos(const toml::node* node) const {
    if (!node) return {};
    return {static_cast<int>(node->source().begin.line), static_cast<int>(node->source().begin.column)};
  }
  void Fail(const toml::node* node, std::string what, std::string fix) override {
    if (!error_) error_ = BadInput(Where(node), std::move(what), std::move(fix));
  }
  void CheckKeys(const toml::table& t, const std::string& section, const std::vector<std::string>& allowed);
  const toml::table* Table(const toml::table& parent, const std::string& key, bool required);
  std::string String(const toml::table& t, const std::string& section, const std::string& key, bool required,
                     const std::string& fallback = {});
  int64_t Integer(const toml::table& t, const std::string& section, const std::string& key, int64_t fallback,
                  int64_t min, int64_t max);
  double Real(const toml::table& t, const std::string& section, const std::string& key, double fallback,
              double min, double max);
  std::vector<std::string> Strings(const toml::table& t, const std::string& section, const std::string& key,
                                   bool required, std::vector<std::string> fallback = {});
  void CheckFile(const toml::node* node, const std::string& rel, const std::string& what);

  void ReadStudy(Design& d);
  void ReadFactors(Design& d);
  void ReadFactorFields(const toml::table& t, const Design& d, Factor& f);
  void ReadFactorDisplay(const toml::table& t, Factor& f);
  void CheckSetGroups(Design& d);
  void ReadPool(const toml::table& t, Design& d);
  void CheckPattern(const toml::table& p, const std::string& key, const std::string& pattern);
  void ReadArms(Design& d);
  void ReadProfiles(Design& d);
  void ReadTemplates(Design& d);
  void ReadSchedule(Design& d);
  void ReadOutcomes(Design& d);
  void ReadRest(Design& d);
  void ReadTeam(Design& d);

  const toml::table& root_;
  std::string label_;
  std::string dir_;
  std::optional<Error> error_;
};

void DesignReader::CheckKeys(const toml::table& t, const std::string& section,
                             const std::vector<std::string>& allowed) {
  for (const auto& [key, node] : t) {
    std::string k(key.str());
    if (std::find(allowed.begin(), allowed.end(), k) == allowed.end())
      Fail(&node, "unknown key '" + Echoed(k) + "' in " + section + DidYouMean(k, allowed),
           "the keys allowed here are: " + [&] {
             std::string s;
             for (const auto& a : allowed) s += (s.empty() ? "" : ", ") + a;
             return s;
           }());
  }
}

const toml::table* DesignReader::Table(const toml::table& parent, const std::string& key, bool required) {
  const toml::node* n = parent.get(key);
  if (!n) {
    if (required) Fail(nullptr, "the section [" + key + "] is missing", "add it; see 'twinprobe init' for an example");
    return nullptr;
  }
  if (!n->is_table()) {
    Fail(n, "'" + key + "' must be a section (a table)", "write it as [" + key + "]");
    return nullptr;
  }
  return n->as_table();
}

std::string DesignReader::String(const toml::table& t, const std::string& section, const std::string& key,
                                 bool required, const std::string& fallback) {
  const toml::node* n = t.get(key);
  if (!n) {
    if (required) Fail(&t, section + "." + key + " is missing", "add " + key + " = \"…\" under " + section);
    return fallback;
  }
  if (!n->is_string()) {
    Fail(n, section + "." + key + " must be a text in quotes", "write " + key + " = \"…\"");
    return fallback;
  }
  return std::string(n->as_string()->get());
}

int64_t DesignReader::Integer(const toml::table& t, const std::string& section, const std::string& key,
                              int64_t fallback, int64_t min, int64_t max) {
  const toml::node* n = t.get(key);
  if (!n) return fallback;
  if (!n->is_integer()) {
    Fail(n, section + "." + key + " must be a whole number", "write " + key + " = 42");
    return fallback;
  }
  int64_t v = n->as_integer()->get();
  if (v < min || v > max)
    Fail(n, section + "." + key + " must be between " + std::to_string(min) + " and " + std::to_string(max) +
                ", got " + std::to_string(v),
         "choose a value in that range");
  return v;
}

double DesignReader::Real(const toml::table& t, const std::string& section, const std::string& key,
                          double fallback, double min, double max) {
  const toml::node* n = t.get(key);
  if (!n) return fallback;
  double v;
  if (n->is_floating_point()) v = n->as_floating_point()->get();
  else if (n->is_integer()) v = static_cast<double>(n->as_integer()->get());
  else {
    Fail(n, section + "." + key + " must be a number", "write " + key + " = 0.05");
    return fallback;
  }
  if (!(v > min && v < max)) {
    std::ostringstream os;
    os << section << "." << key << " must be above " << min << " and below " << max << ", got " << v;
    Fail(n, os.str(), "choose a value in that range");
  }
  return v;
}

std::vector<std::string> DesignReader::Strings(const toml::table& t, const std::string& section,
                                               const std::string& key, bool required,
                                               std::vector<std::string> fallback) {
  return ReadTextList(t, section, key, *this, required, std::move(fallback));
}

void DesignReader::CheckFile(const toml::node* node, const std::string& rel, const std::string& what) {
  if (dir_.empty()) return;
  fs::path p(rel);
  if (p.is_absolute() || rel.find("..") != std::string::npos) {
    Fail(node, what + " '" + rel + "' is outside the study folder", "give a path inside the study folder");
    return;
  }
  // A link inside the study that points out of it would read a file the
  // study does not hold (templates were already refused for this).
  std::error_code ec;
  const fs::path root = fs::weakly_canonical(fs::absolute(dir_), ec);
  const fs::path full = fs::weakly_canonical(fs::absolute(fs::path(dir_) / p), ec);
  const fs::path inside = full.lexically_relative(root);
  if (!ec && fs::exists(full) && (inside.empty() || *inside.begin() == "..")) {
    Fail(node, what + " '" + rel + "' resolves outside the study folder (a symbolic link?)",
         "copy the file into the study folder instead of linking to it");
    return;
  }
  // A device or a FIFO would never end (or never start) being read.
  if (fs::exists(full) && !fs::is_regular_file(full)) {
    Fail(node, what + " '" + rel + "' is not a regular file", "give a plain file");
    return;
  }
  if (!fs::is_regular_file(fs::path(dir_) / p))
    Fail(node, what + " '" + rel + "' does not exist in the study folder", "create it or fix the path");
}

void DesignReader::ReadStudy(Design& d) {
  const toml::table* s = Table(root_, "study", true);
  if (!s) return;
  CheckKeys(*s, "[study]", KeysOf("[study]"));
  d.study_id = String(*s, "[study]", "id", true);
  for (char c : d.study_id)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == '.')) {
      Fail(s->get("id"), "[study].id may hold only letters, digits, '-', '_' and '.'", "rename the study id");
      break;
    }
  d.title = String(*s, "[study]", "title", false, d.study_id);
  d.seed = static_cast<uint64_t>(Integer(*s, "[study]", "seed", 1, 0, INT64_MAX));
  d.kind = String(*s, "[study]", "kind", false, "paired");
  if (d.kind != "paired" && d.kind != "sets" && d.kind != "unpaired" && d.kind != "listing")
    Fail(s->get("kind"), "[study].kind must be paired, sets, unpaired or listing, got '" + d.kind + "'" +
                             DidYouMean(d.kind, {"paired", "sets", "unpaired", "listing"}),
         "pick one of the four");
}

void DesignReader::ReadFactors(Design& d) {
  const toml::node* n = root_.get("factor");
  if (!n) {
    Fail(nullptr, "no [[factor]] is declared", "declare the protected attribute under test as [[factor]]");
    return;
  }
  if (!n->is_array_of_tables()) {
    Fail(n, "'factor' must be written as [[factor]] sections", "write [[factor]] once per attribute");
    return;
  }
  for (const auto& el : *n->as_array()) {
    const toml::table& t = *el.as_table();
    CheckKeys(t, "[[factor]]", KeysOf("[[factor]]"));
    Factor f;
    f.pos = Pos(&t);
    f.name = String(t, "[[factor]]", "name", true);
    f.levels = Strings(t, "[[factor]]", "levels", true);
    if (f.levels.size() < 2 && !error_) Fail(t.get("levels"), "factor '" + f.name + "' needs at least two levels", "list two or more levels");
    f.reference = String(t, "[[factor]]", "reference", false, f.levels.empty() ? "" : f.levels[0]);
    if (!f.levels.empty() && std::find(f.levels.begin(), f.levels.end(), f.reference) == f.levels.end())
      Fail(t.get("reference"), "the reference level '" + f.reference + "' is not a level of '" + f.name + "'" +
                                   DidYouMean(f.reference, f.levels),
           "use one of its levels");
    for (const auto& g : d.factors)
      if (g.name == f.name) Fail(t.get("name"), "factor '" + f.name + "' is declared twice", "rename or remove one");
    ReadFactorFields(t, d, f);
    ReadFactorDisplay(t, f);
    d.factors.push_back(f);
  }
}

// fields = { birth_year = ["2003", "1979"] }: one text per level.
void DesignReader::ReadFactorFields(const toml::table& t, const Design& d, Factor& f) {
  const toml::node* n = t.get("fields");
  if (!n) return;
  if (!n->is_table()) {
    Fail(n, "[[factor]].fields must be a table of lists, one text per level",
         "write fields = { birth_year = [\"2003\", \"1979\"] }");
    return;
  }
  for (const auto& [k, v] : *n->as_table()) {
    std::string field(k.str());
    if (!IsFieldName(field)) {
      Fail(&v, "'" + field + "' is not usable as a template field", "use letters, digits and '_', starting with a letter");
      return;
    }
    const auto& identity = IdentityFields();
    if (std::find(identity.begin(), identity.end(), field) != identity.end()) {
      Fail(&v, "the field '" + field + "' is reserved: twinprobe derives it from the name pools", "choose another name");
      return;
    }
    for (const auto& g : d.factors)
      if (g.fields.count(field)) {
        Fail(&v, "the field '" + field + "' is already set by factor '" + g.name + "'", "let one factor set it");
        return;
      }
    const toml::array* arr = v.as_array();
    std::vector<std::string> values;
    if (arr)
      for (const auto& el : *arr)
        if (el.is_string()) values.emplace_back(el.as_string()->get());
    if (!arr || values.size() != arr->size() || values.size() != f.levels.size()) {
      Fail(&v, "fields." + field + " of factor '" + f.name + "' must list " + std::to_string(f.levels.size()) +
                   " texts, one per level (" + [&] {
                     std::string s;
                     for (const auto& l : f.levels) s += (s.empty() ? "" : ", ") + l;
                     return s;
                   }() + ")",
           "give one text for each level, in the order of levels");
      return;
    }
    f.fields[field] = values;
  }
}

// vary, label, labels = { "28" = "aged 28" } and scores = [28, 45, 58].
void DesignReader::ReadFactorDisplay(const toml::table& t, Factor& f) {
  f.vary = String(t, "[[factor]]", "vary", false, "within");
  if (f.vary != "within" && f.vary != "between") {
    Fail(t.get("vary"), "[[factor]].vary of '" + f.name + "' must be \"within\" or \"between\", got '" + f.vary + "'" +
                            DidYouMean(f.vary, {"within", "between"}),
         "write vary = \"within\" (each vacancy receives every level) or vary = \"between\" (each vacancy one level)");
    return;
  }
  f.label = String(t, "[[factor]]", "label", false);
  if (const toml::node* n = t.get("labels")) {
    if (!n->is_table()) {
      Fail(n, "[[factor]].labels of '" + f.name + "' must be a table of texts, level = label",
           "write labels = { \"" + (f.levels.empty() ? std::string("level") : f.levels.front()) + "\" = \"…\" }");
      return;
    }
    for (const auto& [k, v] : *n->as_table()) {
      std::string level(k.str());
      if (std::find(f.levels.begin(), f.levels.end(), level) == f.levels.end()) {
        Fail(&v, "labels names '" + level + "', which is not a level of '" + f.name + "'" + DidYouMean(level, f.levels),
             "label one of its levels");
        return;
      }
      if (!v.is_string() || v.as_string()->get().empty()) {
        Fail(&v, "the label of level '" + level + "' must be a text in quotes, not empty", "write \"" + level + "\" = \"…\"");
        return;
      }
      f.labels[level] = std::string(v.as_string()->get());
    }
  }
  if (const toml::node* n = t.get("scores")) {
    const toml::array* arr = n->as_array();
    std::vector<double> scores;
    if (arr)
      for (const auto& el : *arr) {
        if (el.is_integer()) scores.push_back(static_cast<double>(el.as_integer()->get()));
        else if (el.is_floating_point() && std::isfinite(el.as_floating_point()->get()))
          scores.push_back(el.as_floating_point()->get());
      }
    if (!arr || scores.size() != arr->size() || scores.size() != f.levels.size()) {
      Fail(n, "[[factor]].scores of '" + f.name + "' must list " + std::to_string(f.levels.size()) +
                  " numbers, one per level in the order of levels",
           "write scores = [28, 45, 58] beside levels (a score says where an ordered level lies)");
      return;
    }
    for (size_t i = 0; i < scores.size(); ++i)
      for (size_t j = 0; j < i; ++j)
        if (scores[i] == scores[j]) {
          Fail(arr->get(i), "levels '" + f.levels[j] + "' and '" + f.levels[i] + "' of '" + f.name +
                                "' have the same score, so the trend test could not order them",
               "give every level its own score");
          return;
        }
    f.scores = scores;
  }
}

std::string ArmLabel(const std::map<std::string, std::string>& levels) {
  std::string label;
  for (const auto& [f, l] : levels) label += (label.empty() ? "" : ",") + f + "=" + l;
  return label;
}

// Arms that include = "all" (every combination) or "neighbours" (the
// reference arm and one change at a time) makes, counted without building
// them; saturates at kMaxArms * 1000 + 1 so no product overflows.
int64_t CountArms(const std::vector<Factor>& factors, bool neighbours) {
  const int64_t cap = kMaxArms * 1000 + 1;
  int64_t n = 1;
  for (const Factor& f : factors) {
    const int64_t levels = static_cast<int64_t>(f.levels.size());
    n = neighbours ? n + std::max<int64_t>(levels - 1, 0) : n * std::max<int64_t>(levels, 1);
    if (n >= cap) return cap;
  }
  return n;
}

void DesignReader::ReadArms(Design& d) {
  const toml::table* a = Table(root_, "arms", false);
  std::vector<std::map<std::string, std::string>> combos;
  if (a) CheckKeys(*a, "[arms]", KeysOf("[arms]"));
  const toml::node* list = a ? a->get("list") : nullptr;
  if (list) {
    if (!list->is_array()) {
      Fail(list, "[arms].list must be a list of inline tables", "write list = [{origin = \"inland\"}, …]");
      return;
    }
    if (list->as_array()->size() > static_cast<size_t>(kMaxArms)) {
      Fail(list, "[arms].list names " + std::to_string(list->as_array()->size()) + " arms, more than the " +
                     std::to_string(kMaxArms) + " a study may have",
           "list fewer arms");
      return;
    }
    for (const auto& el : *list->as_array()) {
      if (!el.is_table()) {
        Fail(&el, "each entry of [arms].list must be an inline table", "write {factor = \"level\"}");
        return;
      }
      std::map<std::string, std::string> combo;
      for (const auto& [k, v] : *el.as_table()) {
        std::string fk(k.str());
        auto fit = std::find_if(d.factors.begin(), d.factors.end(), [&](const Factor& f) { return f.name == fk; });
        std::vector<std::string> names;
        for (const auto& f : d.factors) names.push_back(f.name);
        if (fit == d.factors.end()) {
          Fail(&v, "arm names unknown factor '" + fk + "'" + DidYouMean(fk, names), "declare it as [[factor]] or fix the name");
          return;
        }
        std::string lv = v.is_string() ? std::string(v.as_string()->get()) : "";
        if (std::find(fit->levels.begin(), fit->levels.end(), lv) == fit->levels.end()) {
          Fail(&v, "arm names unknown level '" + lv + "' of factor '" + fk + "'" + DidYouMean(lv, fit->levels),
               "use one of its levels");
          return;
        }
        combo[fk] = lv;
      }
      if (combo.size() != d.factors.size()) {
        Fail(&el, "each arm must give a level for every factor", "add the missing factors to this arm");
        return;
      }
      combos.push_back(combo);
    }
  } else {
    std::string include = a ? String(*a, "[arms]", "include", false, "all") : "all";
    if (include != "all" && include != "neighbours") {
      Fail(a->get("include"),
           "[arms].include must be \"all\" or \"neighbours\", got '" + include + "'" +
               DidYouMean(include, {"all", "neighbours"}),
           "or list the arms with list = [...]");
      return;
    }
    d.arms_include = include;
    // The arms are counted before they are built: 20 two-level factors with
    // include = "all" are 1,048,576 arms, and building them cost gigabytes.
    const int64_t n_arms = CountArms(d.factors, include == "neighbours");
    if (n_arms > kMaxArms) {
      Fail(a && a->get("include") ? a->get("include") : (a ? static_cast<const toml::node*>(a) : nullptr),
           "the design would have " + (n_arms > kMaxArms * 1000 ? "over " + std::to_string(kMaxArms * 1000)
                                                                : std::to_string(n_arms)) +
               " arms (" +
               (include == "neighbours" ? "the reference arm and one change at a time over "
                                        : "every combination of ") +
               std::to_string(d.factors.size()) + " factors' levels), more than the " + std::to_string(kMaxArms) +
               " a study may have",
           "use include = \"neighbours\" (the reference arm and one change at a time) or list the arms with "
           "[arms].list");
      return;
    }
    combos.push_back({});
    for (const auto& f : d.factors) {
      std::vector<std::map<std::string, std::string>> next;
      for (const auto& c : combos)
        for (const auto& l : f.levels) {
          auto e = c;
          e[f.name] = l;
          next.push_back(e);
        }
      combos = next;
    }
    // neighbours: the reference arm and every arm that changes exactly one
    // factor's level, so each arm is compared with the reference on one attribute.
    if (include == "neighbours") {
      std::vector<std::map<std::string, std::string>> kept;
      for (const auto& c : combos) {
        int changed = 0;
        for (const auto& f : d.factors) changed += c.at(f.name) != f.reference;
        if (changed <= 1) kept.push_back(c);
      }
      combos = kept;
    }
  }
  if (list) d.arms_include = "list";
  for (const auto& c : combos) {
    Arm arm;
    arm.levels = c;
    arm.label = ArmLabel(c);
    arm.is_reference = std::all_of(d.factors.begin(), d.factors.end(),
                                   [&](const Factor& f) { return c.at(f.name) == f.reference; });
    for (const auto& other : d.arms)
      if (other.label == arm.label) Fail(list, "arm " + arm.label + " is listed twice", "remove the duplicate");
    d.arms.push_back(arm);
  }
  auto ref = std::find_if(d.arms.begin(), d.arms.end(), [](const Arm& x) { return x.is_reference; });
  if (ref == d.arms.end()) {
    Fail(list, "no arm has every factor at its reference level", "add the reference arm to [arms].list");
    return;
  }
  d.reference_arm = static_cast<int>(ref - d.arms.begin());
  const bool any_between =
      std::any_of(d.factors.begin(), d.factors.end(), [](const Factor& f) { return f.is_between(); });
  if (any_between && d.kind != "unpaired") {
    CheckSetGroups(d);
    return;
  }
  if (d.kind == "paired" && d.arms.size() != 2)
    Fail(a ? static_cast<const toml::node*>(a) : nullptr,
         "a paired study needs exactly two arms, this design has " + std::to_string(d.arms.size()),
         "use kind = \"sets\" for more arms, or list two arms in [arms].list");
  else if (d.arms.size() < 2)
    Fail(a ? static_cast<const toml::node*>(a) : nullptr, "the design has only one arm, so nothing is compared",
         "list at least two arms");
}

// With a factor varied between vacancies, a vacancy receives the arms of
// one between level (planner/set_groups.h). Every such set must hold the
// same within arms, or the between levels would be compared on different
// contrasts, and a set must still compare something.
void DesignReader::CheckSetGroups(Design& d) {
  auto at = [&](const Factor& f) { return label_ + ":" + std::to_string(f.pos.line) + ":" + std::to_string(f.pos.column); };
  const auto within = std::find_if(d.factors.begin(), d.factors.end(), [](const Factor& f) { return !f.is_between(); });
  if (within == d.factors.end()) {
    if (!error_)
      error_ = BadInput(at(d.factors.front()),
                        "every factor varies between vacancies, so each vacancy of this " + d.kind +
                            " study would receive one probe and no set would compare anything",
                        "let the attribute under test vary within vacancies (vary = \"within\"), or use kind = "
                        "\"unpaired\"");
    return;
  }
  const auto groups = SetGroups(d);
  auto within_of = [&](const SetGroup& g) {
    std::set<std::string> labels;
    for (int a : g.arms) labels.insert(WithinLabel(d, d.arms[static_cast<size_t>(a)]));
    return labels;
  };
  const std::set<std::string> first = within_of(groups.front());
  for (const auto& g : groups) {
    const std::set<std::string> mine = within_of(g);
    if (mine == first) continue;
    const std::set<std::string>& more = mine.size() < first.size() ? first : mine;
    const SetGroup& lacking = mine.size() < first.size() ? g : groups.front();
    const std::set<std::string> lacking_set = within_of(lacking);
    std::string missing;
    for (const auto& l : more)
      if (!lacking_set.count(l)) missing += (missing.empty() ? "" : ", ") + l;
    if (missing.empty())
      for (const auto& l : lacking_set)
        if (!more.count(l)) missing += (missing.empty() ? "" : ", ") + l;
    if (!error_)
      error_ = BadInput(label_, "the vacancies that receive " + ArmLabel(lacking.between) +
                                    " would not receive the same arms as the others (missing: " + missing + ")",
                        "give every level of a between factor the same arms of the within factors: use include = "
                        "\"all\" or list the missing arms in [arms].list");
    return;
  }
  const size_t per_set = groups.front().arms.size();
  if (d.kind == "paired" && per_set != 2) {
    if (!error_)
      error_ = BadInput(at(*within), "a paired study needs two arms per vacancy, this design gives each vacancy " +
                                         std::to_string(per_set),
                        "use kind = \"sets\" for more arms per vacancy");
  } else if (per_set < 2 && !error_) {
    error_ = BadInput(at(*within), "each vacancy would receive one arm, so nothing is compared within it",
                      "let a factor with two or more levels vary within vacancies");
  }
}

void DesignReader::CheckPattern(const toml::table& p, const std::string& key, const std::string& pattern) {
  for (size_t open = pattern.find('{'); open != std::string::npos; open = pattern.find('{', open + 1)) {
    size_t close = pattern.find('}', open);
    std::string placeholder = pattern.substr(open, close == std::string::npos ? std::string::npos : close - open + 1);
    const auto& allowed = ContactPlaceholders();
    if (std::find(allowed.begin(), allowed.end(), placeholder) == allowed.end()) {
      Fail(p.get(key), "[profiles]." + key + " uses unknown placeholder '" + placeholder + "'" +
                           DidYouMean(placeholder, allowed),
           "use {given}, {family} or {n}");
      return;
    }
  }
}

// One [[profiles.pool]]: factor = "origin", level = "coastal" (names signal one
// factor) or levels = { gender = "f", origin = "coastal" } (several).
void DesignReader::ReadPool(const toml::table& t, Design& d) {
  CheckKeys(t, "[[profiles.pool]]", KeysOf("[[profiles.pool]]"));
  NamePool np;
  np.pos = Pos(&t);
  np.file = String(t, "[[profiles.pool]]", "file", true);
  auto check_level = [&](const toml::node* at, const std::string& factor, const std::string& level) {
    auto fit = std::find_if(d.factors.begin(), d.factors.end(), [&](const Factor& f) { return f.name == factor; });
    std::vector<std::string> names;
    for (const auto& f : d.factors) names.push_back(f.name);
    if (fit == d.factors.end()) {
      Fail(at, "name pool for unknown factor '" + factor + "'" + DidYouMean(factor, names), "use a declared factor");
      return;
    }
    if (std::find(fit->levels.begin(), fit->levels.end(), level) == fit->levels.end())
      Fail(at, "name pool for unknown level '" + level + "' of '" + factor + "'" + DidYouMean(level, fit->levels),
           "use one of its levels");
    np.levels[factor] = level;
  };
  if (const toml::node* lv = t.get("levels")) {
    if (t.get("factor") || t.get("level")) {
      Fail(lv, "a name pool gives either factor and level, or levels", "keep one of the two forms");
      return;
    }
    if (!lv->is_table() || lv->as_table()->empty()) {
      Fail(lv, "[[profiles.pool]].levels must be a table of factor = level", "write levels = { gender = \"f\", origin = \"coastal\" }");
      return;
    }
    for (const auto& [k, v] : *lv->as_table())
      check_level(&v, std::string(k.str()), v.is_string() ? std::string(v.as_string()->get()) : "");
  } else {
    np.factor = String(t, "[[profiles.pool]]", "factor", true);
    np.level = String(t, "[[profiles.pool]]", "level", true);
    if (error_) return;
    if (std::find_if(d.factors.begin(), d.factors.end(), [&](const Factor& f) { return f.name == np.factor; }) ==
        d.factors.end())
      check_level(t.get("factor"), np.factor, np.level);
    else
      check_level(t.get("level"), np.factor, np.level);
  }
  if (error_) return;
  CheckFile(t.get("file"), np.file, "the name pool");
  std::vector<std::string> keyed;
  for (const auto& [f, l] : np.levels) keyed.push_back(f);
  if (d.name_factors.empty()) {
    d.name_factors = keyed;
  } else if (keyed != d.name_factors) {
    auto join = [](const std::vector<std::string>& v) {
      std::string s;
      for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
      return s;
    };
    Fail(&t, "this name pool is keyed by " + join(keyed) + " but the first pool by " + join(d.name_factors),
         "key every pool by the same factors");
    return;
  }
  for (const auto& other : d.name_pools)
    if (other.levels == np.levels) {
      Fail(&t, "two name pools are given for " + ArmLabel(np.levels), "merge them into one file");
      return;
    }
  d.name_pools.push_back(np);
}

void DesignReader::ReadProfiles(Design& d) {
  const toml::table* p = Table(root_, "profiles", true);
  if (!p) return;
  CheckKeys(*p, "[profiles]", KeysOf("[profiles]"));
  d.mailbox_pattern = String(*p, "[profiles]", "mailbox", false, d.mailbox_pattern);
  d.phone_pattern = String(*p, "[profiles]", "phone", false, "");
  CheckPattern(*p, "mailbox", d.mailbox_pattern);
  CheckPattern(*p, "phone", d.phone_pattern);
  const toml::node* pools = p->get("pool");
  if (pools && !pools->is_array_of_tables()) {
    Fail(pools, "name pools must be written as [[profiles.pool]] sections", "write one [[profiles.pool]] per level");
    return;
  }
  if (!pools) {
    Fail(p, "no name pool is declared", "add one [[profiles.pool]] per level of the factor the names signal");
    return;
  }
  for (const auto& el : *pools->as_array()) {
    ReadPool(*el.as_table(), d);
    if (error_) return;
  }
  // Every arm needs the pool of its name-factor levels.
  for (const auto& arm : d.arms) {
    if (PoolOfArm(d, arm) >= 0) continue;
    if (d.name_factors.size() == 1) {
      const std::string& f = d.name_factors.front();
      const std::string& l = arm.levels.at(f);
      Fail(p, "level '" + l + "' of factor '" + f + "' has no name pool",
           "add [[profiles.pool]] with factor = \"" + f + "\", level = \"" + l + "\" and a names file");
    } else {
      std::map<std::string, std::string> key;
      for (const auto& f : d.name_factors) key[f] = arm.levels.at(f);
      Fail(p, "the levels " + ArmLabel(key) + " have no name pool",
           "add [[profiles.pool]] with levels = {…} and a names file");
    }
    return;
  }
  // Every factor must show in the materials: through the names or through
  // fields of its own; otherwise its arms would send identical applications.
  for (const auto& f : d.factors) {
    bool named = std::find(d.name_factors.begin(), d.name_factors.end(), f.name) != d.name_factors.end();
    if (!named && f.fields.empty()) {
      if (!error_)
        error_ = BadInput(label_ + ":" + std::to_string(f.pos.line) + ":" + std::to_string(f.pos.column),
                        "factor '" + f.name + "' changes nothing in the applications: no name pool is keyed by it and it sets no template field",
                        "add fields = { … } to its [[factor]], or key the name pools by it");
      return;
    }
  }
}

void DesignReader::ReadTemplates(Design& d) {
  const toml::table* t = Table(root_, "templates", true);
  if (!t) return;
  CheckKeys(*t, "[templates]", KeysOf("[templates]"));
  d.templates = Strings(*t, "[templates]", "files", true);
  const toml::node* files = t->get("files");
  if (files && files->is_array())
    for (size_t i = 0; i < d.templates.size(); ++i) CheckFile(files->as_array()->get(i), d.templates[i], "the template");
  d.factor_fields = Strings(*t, "[templates]", "factor_fields", false,
                            {"given_name", "family_name", "full_name", "mailbox", "phone"});
  const size_t per_set = d.arms.empty() ? 0 : d.kind == "unpaired" ? 1 : SetGroups(d).front().arms.size();
  if (d.kind != "unpaired" && d.templates.size() < per_set && !error_) {
    if (per_set == d.arms.size())
      Fail(files, "a " + d.kind + " study with " + std::to_string(d.arms.size()) + " arms needs at least " +
                      std::to_string(d.arms.size()) + " templates, so no two probes of one set share one",
           "add templates to [templates].files");
    else
      Fail(files, "a " + d.kind + " study with " + std::to_string(per_set) + " arms per vacancy needs at least " +
                      std::to_string(per_set) + " templates, so no two probes of one set share one",
           "add templates to [templates].files");
  }
}

void DesignReader::ReadSchedule(Design& d) {
  const toml::table* s = Table(root_, "schedule", false);
  if (!s) return;
  CheckKeys(*s, "[schedule]", KeysOf("[schedule]"));
  d.schedule.start = String(*s, "[schedule]", "start", false, "");
  if (!d.schedule.start.empty() && !ParseIsoTime(d.schedule.start))
    Fail(s->get("start"), "[schedule].start '" + d.schedule.start + "' " + WhyNotATime(d.schedule.start, "is not a date"), "write it as YYYY-MM-DD");
  d.schedule.sets_per_day = static_cast<int>(Integer(*s, "[schedule]", "sets_per_day", 20, 1, 1000000));
  d.schedule.early_days = static_cast<int>(Integer(*s, "[schedule]", "early_days", 1, 0, 365));
  if (const toml::node* h = s->get("hours")) {
    const toml::array* arr = h->as_array();
    if (!arr || arr->size() != 2 || !arr->get(0)->is_integer() || !arr->get(1)->is_integer()) {
      Fail(h, "[schedule].hours must be two whole numbers [open, close]", "write hours = [9, 17] (UTC)");
    } else {
      int64_t open = arr->get(0)->as_integer()->get(), close = arr->get(1)->as_integer()->get();
      if (open < 0 || close > 24 || open >= close)
        Fail(h, "[schedule].hours must satisfy 0 <= open < close <= 24, got [" + std::to_string(open) + ", " +
                    std::to_string(close) + "]",
             "write hours = [9, 17] (UTC)");
      else
        d.schedule.hour_open = static_cast<int>(open), d.schedule.hour_close = static_cast<int>(close);
    }
  }
  if (const toml::node* g = s->get("gap_hours")) {
    const toml::array* arr = g->as_array();
    if (!arr || arr->size() != 2 || !arr->get(0)->is_integer() || !arr->get(1)->is_integer()) {
      Fail(g, "[schedule].gap_hours must be two whole numbers [min, max]", "write gap_hours = [24, 72]");
    } else {
      d.schedule.gap_pos = Pos(g);
      int64_t lo = arr->get(0)->as_integer()->get(), hi = arr->get(1)->as_integer()->get();
      d.schedule.gap_min_hours = static_cast<int>(std::clamp<int64_t>(lo, -1, 100000));
      d.schedule.gap_max_hours = static_cast<int>(std::clamp<int64_t>(hi, -1, 100000));
      if (hi > 24 * 60)
        Fail(g, "[schedule].gap_hours above " + std::to_string(24 * 60) + " hours (60 days) is not supported",
             "use a shorter gap");
      else if (d.schedule.gap_min_hours < 0)
        Fail(g, "[schedule].gap_hours cannot be negative", "use hours of 0 or more");
      else if (d.schedule.gap_min_hours > d.schedule.gap_max_hours)
        Fail(g, "[schedule].gap_hours is reversed: min " + std::to_string(d.schedule.gap_min_hours) + " > max " +
                    std::to_string(d.schedule.gap_max_hours),
             "write the smaller number first");
    }
  }
  static const std::vector<std::string> kDays = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};
  if (s->get("weekdays")) {
    d.schedule.weekdays.clear();
    for (const auto& w : Strings(*s, "[schedule]", "weekdays", false)) {
      auto it = std::find(kDays.begin(), kDays.end(), w);
      if (it == kDays.end())
        Fail(s->get("weekdays"), "unknown weekday '" + w + "'" + DidYouMean(w, kDays), "use mon, tue, … sun");
      else
        d.schedule.weekdays.push_back(static_cast<int>(it - kDays.begin()));
    }
    if (d.schedule.weekdays.empty() && !error_)
      Fail(s->get("weekdays"), "[schedule].weekdays is empty", "list at least one sending day");
  }
  // Gaps matter only between the probes of a set.
  if (!error_ && (d.kind == "paired" || d.kind == "sets")) {
    Status keepable = CheckGapsKeepable(d.schedule, Where(s->get("gap_hours") ? s->get("gap_hours") : s));
    if (!keepable.ok()) error_ = keepable.error();
  }
}

void DesignReader::ReadOutcomes(Design& d) {
  const toml::table* o = Table(root_, "outcomes", false);
  if (!o) return;
  CheckKeys(*o, "[outcomes]", KeysOf("[outcomes]"));
  d.outcomes.codes = Strings(*o, "[outcomes]", "codes", false, d.outcomes.codes);
  d.outcomes.positive = Strings(*o, "[outcomes]", "positive", false, d.outcomes.positive);
  d.outcomes.window_days = static_cast<int>(Integer(*o, "[outcomes]", "window_days", 28, 1, 3650));
  for (const auto& p : d.outcomes.positive)
    if (!d.outcomes.has_code(p))
      Fail(o->get("positive"), "positive code '" + p + "' is not among [outcomes].codes" + DidYouMean(p, d.outcomes.codes),
           "add it to codes or fix the spelling");
  if (d.outcomes.positive.empty() && !error_)
    Fail(o, "[outcomes].positive is empty", "say which codes count as a positive callback");
}

void DesignReader::ReadRest(Design& d) {
  if (const toml::table* s = Table(root_, "strata", false)) {
    CheckKeys(*s, "[strata]", KeysOf("[strata]"));
    d.strata = Strings(*s, "[strata]", "columns", false);
  }
  if (const toml::table* v = Table(root_, "vacancies", false)) {
    CheckKeys(*v, "[vacancies]", KeysOf("[vacancies]"));
    d.vacancies_file = String(*v, "[vacancies]", "file", false, d.vacancies_file);
    CheckFile(v->get("file"), d.vacancies_file, "the vacancies file");
  }
  if (const toml::table* a = Table(root_, "analysis", false)) {
    CheckKeys(*a, "[analysis]", KeysOf("[analysis]"));
    d.analysis.primary = String(*a, "[analysis]", "primary", false, d.analysis.primary);
    d.analysis.correction = String(*a, "[analysis]", "correction", false, d.analysis.correction);
    static const std::vector<std::string> kCorrections = {"none", "bonferroni", "holm", "hochberg", "hommel", "bh", "by"};
    if (std::find(kCorrections.begin(), kCorrections.end(), d.analysis.correction) == kCorrections.end())
      Fail(a->get("correction"), "unknown correction '" + d.analysis.correction + "'" +
                                     DidYouMean(d.analysis.correction, kCorrections),
           "use none, bonferroni, holm, hochberg, hommel, bh or by");
    d.analysis.alpha = Real(*a, "[analysis]", "alpha", 0.05, 0.0, 1.0);
    d.analysis.equivalence_margin = Real(*a, "[analysis]", "equivalence_margin", 0.0, 0.0, 1.0);
    if (a->get("equivalence_margin") && d.analysis.alpha >= 0.5)
      Fail(a->get("alpha"), "[analysis].alpha must be below 0.5 when equivalence_margin is set",
           "the two one-sided tests each run at alpha; write alpha = 0.05");
    d.analysis.spending = String(*a, "[analysis]", "spending", false, d.analysis.spending);
    if (d.analysis.spending != "obf" && d.analysis.spending != "pocock")
      Fail(a->get("spending"), "unknown spending function '" + d.analysis.spending + "'",
           "write spending = \"obf\" (O'Brien\u2013Fleming type) or spending = \"pocock\" (Pocock type)");
    if (const toml::node* looks = a->get("looks")) {
      const toml::array* arr = looks->as_array();
      if (!arr) Fail(looks, "[analysis].looks must be a list of whole numbers", "write looks = [200, 400]");
      else
        for (const auto& el : *arr) {
          if (!el.is_integer() || el.as_integer()->get() <= 0) {
            Fail(&el, "[analysis].looks must hold positive whole numbers", "write looks = [200, 400]");
            break;
          }
          d.analysis.looks.push_back(static_cast<int>(el.as_integer()->get()));
        }
      // Planned looks in a design `monitor` cannot watch would promise
      // monitoring that it refuses mid-fieldwork (planner/monitorable.h).
      if (std::string why = MonitorRefusal(d); arr && !why.empty())
        Fail(looks, "[analysis].looks plans interim looks, but " + why,
             "remove looks and analyse once at the end of fieldwork with 'twinprobe analyze'");
    }
  }
  if (const toml::table* e = Table(root_, "ethics", false)) {
    CheckKeys(*e, "[ethics]", KeysOf("[ethics]"));
    d.ethics.present = true;
    d.ethics.approval = String(*e, "[ethics]", "approval", false);
    d.ethics.retention_days = static_cast<int>(Integer(*e, "[ethics]", "retention_days", 0, 1, 36500));
    d.ethics.decline_within_hours = static_cast<int>(Integer(*e, "[ethics]", "decline_within_hours", 0, 1, 720));
    d.ethics.cap_per_employer = static_cast<int>(Integer(*e, "[ethics]", "cap_per_employer", 0, 1, 1000));
  }
}

// [team] members = ["Ada Moss", …]: the people who may sign in to the desk.
// A name is what the store records as entered_by, so it must be printable
// text of reasonable length.
void DesignReader::ReadTeam(Design& d) {
  const toml::table* t = Table(root_, "team", false);
  if (!t) return;
  CheckKeys(*t, "[team]", KeysOf("[team]"));
  d.team = Strings(*t, "[team]", "members", true);
  const toml::array* arr = t->get("members") ? t->get("members")->as_array() : nullptr;
  for (size_t i = 0; arr && i < d.team.size() && i < arr->size(); ++i) {
    const std::string& name = d.team[i];
    const toml::node* at = arr->get(i);
    const bool control = std::any_of(name.begin(), name.end(), [](char c) {
      return static_cast<unsigned char>(c) < 0x20 || c == 0x7f;
    });
    if (name.empty() || name.size() > 60 || control || name.front() == ' ' || name.back() == ' ')
      Fail(at, "[team].members holds '" + name + "', which is not a usable name",
           "write each member as 1 to 60 printable characters without leading or trailing spaces");
  }
  if (arr && arr->empty()) Fail(arr, "[team].members is empty", "name at least one member, or leave out [team]");
}

Result<Design> DesignReader::Read() {
  CheckKeys(root_, "the design", KeysOf("the design"));
  Design d;
  ReadStudy(d);
  // A listing audit (kind = "listing") sends no probes: its factors, profiles
  // and templates are optional (planner/source_section.h).
  auto wanted = [&](const char* section) { return d.kind != "listing" || root_.get(section); };
  if (!error_ && wanted("factor")) ReadFactors(d);
  if (!error_ && wanted("factor")) ReadArms(d);
  if (!error_ && wanted("profiles")) ReadProfiles(d);
  if (!error_ && wanted("templates")) ReadTemplates(d);
  if (!error_) ReadSchedule(d);
  if (!error_) ReadOutcomes(d);
  if (!error_) ReadRest(d);
  if (!error_) ReadTeam(d);
  if (!error_)
    if (Status s = ReadSources(root_, label_, d); !s.ok()) error_ = s.error();
  if (Status mail = error_ ? Status() : ReadMailSection(root_, label_, d); !mail.ok()) error_ = mail.error();
  if (error_) return *error_;
  // Canonical form: the parsed tables as JSON with keys in sorted order
  // (toml++ keeps tables ordered), so comments and layout do not change it.
  // [team] is left out: adding a member mid-study changes no design.
  toml::table canonical = root_;
  canonical.erase("team");
  std::ostringstream os;
  os << toml::json_formatter{canonical};
  d.canonical = os.str();
  return d;
}

}  // namespace

const std::vector<DesignSectionKeys>& KnownDesignKeys() {
  static const std::vector<DesignSectionKeys> kKeys{
      {"the design",
       {"study", "factor", "arms", "profiles", "templates", "vacancies", "schedule", "outcomes", "strata", "analysis",
        "ethics", "source", "mail", "team"}},
      {"[study]", {"id", "title", "seed", "kind"}},
      {"[[factor]]", {"name", "levels", "reference", "fields", "vary", "label", "labels", "scores"}},
      {"[arms]", {"include", "list"}},
      {"[profiles]", {"mailbox", "phone", "pool"}},
      {"[[profiles.pool]]", {"factor", "level", "levels", "file"}},
      {"[templates]", {"files", "factor_fields"}},
      {"[vacancies]", {"file"}},
      {"[schedule]", {"start", "gap_hours", "weekdays", "hours", "sets_per_day", "early_days"}},
      {"[outcomes]", {"codes", "positive", "window_days"}},
      {"[strata]", {"columns"}},
      {"[analysis]", {"primary", "correction", "alpha", "looks", "spending", "equivalence_margin"}},
      {"[ethics]", {"approval", "retention_days", "decline_within_hours", "cap_per_employer"}},
      {"[team]", {"members"}},
  };
  return kKeys;
}

std::string DesignPath(const std::string& study_dir) { return (fs::path(study_dir) / "study.toml").string(); }

Result<Design> ParseDesign(std::string_view text, const std::string& label, const std::string& study_dir) {
  toml::table root;
  try {
    root = toml::parse(text, label);
  } catch (const toml::parse_error& e) {
    const auto& b = e.source().begin;
    return BadInput(label + ":" + std::to_string(b.line) + ":" + std::to_string(b.column),
                    "not valid TOML: " + std::string(e.description()), "fix the syntax at this place");
  }
  return DesignReader(root, label, study_dir).Read();
}

Result<Design> LoadDesign(const std::string& study_dir) {
  std::string path = DesignPath(study_dir);
  std::ifstream in(path, std::ios::binary);
  if (!in)
    return BadInput(path, "no design file here", "run 'twinprobe init' to create one, or pass --study DIR");
  std::stringstream ss;
  ss << in.rdbuf();
  auto design = ParseDesign(ss.str(), path, study_dir);
  // The inputs `freeze` covers and `analyze` compares with the freeze.
  if (design.ok()) design.value().inputs = FormatInputs(ReadAnalysisInputs(design.value(), study_dir));
  return design;
}

}  // namespace twinprobe
