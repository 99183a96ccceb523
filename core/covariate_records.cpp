#include "core/covariate_records.h"

#include <charconv>
#include <cmath>
#include <map>

#include "core/meta.h"

namespace twinprobe {

std::optional<double> CovariateNumber(std::string_view cell) {
  while (!cell.empty() && cell.front() == ' ') cell.remove_prefix(1);
  while (!cell.empty() && cell.back() == ' ') cell.remove_suffix(1);
  if (cell.empty()) return std::nullopt;
  // from_chars takes no leading '+'; a spreadsheet may write one.
  if (cell.front() == '+') cell.remove_prefix(1);
  double value = 0;
  auto [end, ec] = std::from_chars(cell.data(), cell.data() + cell.size(), value, std::chars_format::general);
  if (ec != std::errc() || end != cell.data() + cell.size() || !std::isfinite(value)) return std::nullopt;
  return value;
}

CovariateTable ReadCovariates(Store& store) {
  CovariateTable out;
  out.names = MetaList(store, "covariates");
  if (out.names.empty()) return out;
  // One row per application and covariate, in probe order; the values of
  // one application are gathered, then its pattern counted.
  Stmt s = store.Prepare(
      "SELECT p.id, a.label, r.code, c.name, c.value FROM current_probe p JOIN arm a ON a.id = p.arm_id "
      "JOIN current_response r ON r.probe_id = p.id "
      "LEFT JOIN application_covariate c ON c.probe_id = p.id ORDER BY p.id");
  std::map<std::vector<std::string>, int64_t> counts;  // key: arm, code, values...
  int64_t current = -1;
  std::vector<std::string> key;
  size_t found = 0;
  auto flush = [&] {
    if (current < 0) return;
    if (found == out.names.size()) ++counts[key];
    else ++out.applications_without;
  };
  while (s.Step()) {
    const int64_t probe = s.Int(0);
    if (probe != current) {
      flush();
      current = probe;
      key.assign(2 + out.names.size(), std::string());
      key[0] = s.Text(1);
      key[1] = s.Text(2);
      found = 0;
    }
    if (s.IsNull(3)) continue;
    const std::string name = s.Text(3);
    for (size_t i = 0; i < out.names.size(); ++i)
      if (out.names[i] == name) {
        key[2 + i] = s.Text(4);
        ++found;
      }
  }
  flush();
  for (auto& [k, n] : counts) {
    CovariatePattern p;
    p.arm = k[0];
    p.code = k[1];
    p.values.assign(k.begin() + 2, k.end());
    p.applications = n;
    out.patterns.push_back(std::move(p));
  }
  return out;
}

}  // namespace twinprobe
