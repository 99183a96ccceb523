#include "collector/import_applications.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdlib>

#include "core/comma_list.h"
#include "core/suggest.h"
#include "core/text.h"

namespace twinprobe {
namespace {

// The roles a file's columns can be mapped to (the importer's own names).
const std::vector<std::string> kRoles = {"vacancy", "arm", "outcome", "sent_at", "responded_at", "probe", "employer"};
const std::vector<std::string> kKinds = {"paired", "sets", "unpaired"};

// A factor name is used in sentences and as a level's prefix ("sex=female").
bool IsFactorName(const std::string& name) {
  if (name.empty() || name.size() > 40) return false;
  return std::all_of(name.begin(), name.end(), [](char c) {
    return std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-' || c == ' ';
  });
}

}  // namespace

Result<std::vector<std::pair<std::string, std::string>>> ParseColumnMap(const std::string& text) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const std::string& entry : SplitCommaList(text)) {
    size_t eq = entry.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == entry.size())
      return BadInput("--columns", "'" + entry + "' is not ROLE=COLUMN",
                      "write each mapping as ROLE=COLUMN, e.g. --columns arm=group,outcome=invited,vacancy=req_id");
    std::string role = entry.substr(0, eq), column = entry.substr(eq + 1);
    while (!role.empty() && role.back() == ' ') role.pop_back();
    while (!column.empty() && column.front() == ' ') column.erase(column.begin());
    if (std::find(kRoles.begin(), kRoles.end(), role) == kRoles.end())
      return BadInput("--columns", "'" + role + "' is not a column role" + DidYouMean(role, kRoles),
                      "map the file's columns to vacancy, arm, outcome, sent_at, responded_at, probe or employer");
    for (const auto& [seen, _] : out)
      if (seen == role)
        return BadInput("--columns", "the role '" + role + "' is mapped twice", "map each role to one column");
    out.emplace_back(role, column);
  }
  return out;
}

Result<std::vector<std::pair<std::string, double>>> ParseScores(const std::string& text) {
  std::vector<std::pair<std::string, double>> out;
  for (const std::string& entry : SplitCommaList(text)) {
    size_t eq = entry.rfind('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == entry.size())
      return BadInput("--scores", "'" + entry + "' is not GROUP=SCORE",
                      "give each group its score, e.g. --scores a28=28,a45=45,a58=58");
    const std::string level(Trim(entry.substr(0, eq)));
    const std::string number(Trim(entry.substr(eq + 1)));
    char* end = nullptr;
    const double score = std::strtod(number.c_str(), &end);
    if (number.empty() || end != number.c_str() + number.size() || !std::isfinite(score))
      return BadInput("--scores", "the score of '" + level + "' ('" + number + "') is not a number",
                      "write a number after '=', e.g. " + level + "=28");
    for (const auto& [seen, _] : out)
      if (seen == level) return BadInput("--scores", "'" + level + "' has two scores", "give each group one score");
    out.emplace_back(level, score);
  }
  return out;
}

Result<PairsImportSummary> ImportApplications(const std::string& store_path, const Design* design,
                                              const std::string& path, const ApplicationsImportOptions& o) {
  if (std::find(kKinds.begin(), kKinds.end(), o.kind) == kKinds.end())
    return BadInput("--kind", "'" + o.kind + "' is not a kind of study" + DidYouMean(o.kind, kKinds),
                    "use paired (two groups, one application of each per vacancy), sets (one of each group per "
                    "vacancy) or unpaired (any applications, vacancies optional)");
  const std::string factor = o.factor.empty() ? "group" : o.factor;
  if (!IsFactorName(factor))
    return BadInput("--factor", "'" + factor + "' is not a usable name for the attribute",
                    "use up to 40 letters, digits, spaces, '_' or '-', e.g. --factor gender");
  auto columns = ParseColumnMap(o.columns);
  if (!columns.ok()) return columns.error();
  PairsImportOptions base = o.base;
  base.records = true;
  base.kind = o.kind;
  base.column_names = columns.value();
  base.factor = factor;
  base.positive = SplitCommaList(o.positive);
  base.stages = SplitCommaList(o.stages);
  base.covariates = SplitCommaList(o.covariates);
  auto scores = ParseScores(o.scores);
  if (!scores.ok()) return scores.error();
  base.scores = scores.value();
  if (!o.stages.empty()) {
    std::vector<std::string> sorted = base.stages;
    std::sort(sorted.begin(), sorted.end());
    if (base.stages.size() < 2 || std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end())
      return BadInput("--stages", "'" + o.stages + "' does not name two or more different stages",
                      "list the stages in order, e.g. --stages applied,screened,interview,offer,hire");
  }
  return ImportPairs(store_path, design, path, base);
}

}  // namespace twinprobe
