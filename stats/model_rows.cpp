#include "stats/model_rows.h"

#include <cmath>

namespace twinprobe::stats {

bool CheckCovariateRow(const std::vector<double>& row, size_t expected, size_t index, std::string& why) {
  if (row.size() != expected) {
    why = "row " + std::to_string(index + 1) + " has " + std::to_string(row.size()) + " covariates, expected " +
          std::to_string(expected);
    return false;
  }
  for (double v : row)
    if (!std::isfinite(v)) {
      why = "row " + std::to_string(index + 1) + " has a covariate that is not a finite number";
      return false;
    }
  return true;
}

}  // namespace twinprobe::stats
