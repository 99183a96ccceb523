#include "core/factor_signal.h"

#include <algorithm>

namespace twinprobe {

FactorSignal SignalOf(const Design& d, const Factor& f) {
  FactorSignal s;
  s.by_name = std::find(d.name_factors.begin(), d.name_factors.end(), f.name) != d.name_factors.end();
  for (const auto& [field, values] : f.fields) s.fields.push_back(field);  // std::map: sorted
  return s;
}

std::string DescribeSignal(const FactorSignal& s) {
  std::string fields;
  for (size_t i = 0; i < s.fields.size(); ++i)
    fields += (i == 0 ? "" : i + 1 == s.fields.size() ? " and " : ", ") + s.fields[i];
  const std::string field_words =
      s.fields.empty() ? "" : (s.fields.size() == 1 ? "the template field " : "the template fields ") + fields;
  const std::string name_words = s.by_name ? "the applicant's name and contact details" : "";
  if (!name_words.empty() && !field_words.empty()) return name_words + " and " + field_words;
  if (!name_words.empty()) return name_words;
  if (!field_words.empty()) return field_words;
  return "no field";
}

}  // namespace twinprobe
