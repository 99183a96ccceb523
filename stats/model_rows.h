#pragma once
// Checks shared by the regression models (stats/logistic.h, stats/clogit.h)
// on the covariate rows they are given.
#include <cstddef>
#include <string>
#include <vector>

namespace twinprobe::stats {

// True when row `index` (0-based) holds `expected` covariates, each a finite
// number; otherwise false, with `why` naming the row as the user counts it
// ("row 3 has 2 covariates, expected 3").
bool CheckCovariateRow(const std::vector<double>& row, size_t expected, size_t index, std::string& why);

}  // namespace twinprobe::stats
