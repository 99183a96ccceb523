#include "core/design.h"

#include <algorithm>
#include <cstdio>

#include "core/level_labels.h"

namespace twinprobe {

std::string Factor::LevelLabel(const std::string& level) const { return LevelDisplay(labels, level); }

bool OutcomeScheme::is_positive(const std::string& code) const {
  return std::find(positive.begin(), positive.end(), code) != positive.end();
}

bool OutcomeScheme::has_code(const std::string& code) const {
  return std::find(codes.begin(), codes.end(), code) != codes.end();
}

std::string CanonicalAnalysisPlan(const Design& d) {
  auto join = [](const std::vector<std::string>& v, const char* sep) {
    std::string s;
    for (size_t i = 0; i < v.size(); ++i) s += (i ? sep : "") + v[i];
    return s;
  };
  std::vector<std::string> arms;
  for (const auto& a : d.arms) arms.push_back(a.label);
  std::vector<std::string> looks;
  for (int l : d.analysis.looks) looks.push_back(std::to_string(l));
  char alpha[40];
  std::snprintf(alpha, sizeof alpha, "%.17g", d.analysis.alpha);
  // Arm labels hold commas ("gender=f,origin=coastal"), so arms are joined by '|'.
  std::string out;
  out += "kind=" + d.kind + "\n";
  out += "arms=" + join(arms, "|") + "\n";
  out += "reference=" + (d.arms.empty() ? std::string() : d.arms[d.reference_arm].label) + "\n";
  out += "codes=" + join(d.outcomes.codes, ",") + "\n";
  out += "positive=" + join(d.outcomes.positive, ",") + "\n";
  out += "window_days=" + std::to_string(d.outcomes.window_days) + "\n";
  out += "strata=" + join(d.strata, ",") + "\n";
  out += "primary=" + d.analysis.primary + "\n";
  out += "correction=" + d.analysis.correction + "\n";
  out += "alpha=" + std::string(alpha) + "\n";
  out += "looks=" + join(looks, ",") + "\n";
  // The spending function belongs to the monitoring plan: written only when
  // looks are planned, so plans without monitoring keep their hash.
  if (!looks.empty()) out += "spending=" + d.analysis.spending + "\n";
  // Written only when set, so the plans frozen before the key existed keep
  // their canonical form (and their hash).
  if (d.analysis.equivalence_margin > 0) {
    char margin[40];
    std::snprintf(margin, sizeof margin, "%.17g", d.analysis.equivalence_margin);
    out += "equivalence_margin=" + std::string(margin) + "\n";
  }
  return out;
}

}  // namespace twinprobe
