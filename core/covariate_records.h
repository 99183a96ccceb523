#pragma once
// The covariates `import applications --covariates` keeps with each
// application (table application_covariate, migration 14), and the one rule
// that says whether a covariate is a number or a category. The importer
// writes them; the adjusted logistic model (analysis/covariate_model.h)
// reads them back, grouped, so memory grows with the distinct combinations of
// group, outcome and covariate values, not with the applications.
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/store.h"

namespace twinprobe {

// At most this many covariate columns, and this many distinct values of a
// categorical one: each category is a column of the model's matrix, and a
// model of hundreds of columns on a few thousand rows estimates nothing.
constexpr size_t kMaxCovariates = 10;
constexpr size_t kMaxCovariateCategories = 50;

// The number a covariate cell holds, when the whole cell (spaces around it
// allowed) is a finite decimal number such as 12, -3.5 or 1.2e3; else none.
// A covariate is numeric when every one of its cells is a number, and
// categorical otherwise (then "12" is a category like any other).
std::optional<double> CovariateNumber(std::string_view cell);

// The importer writes them with the probes (PairsWriter::AddCovariate,
// core/import_pairs_writer.h), batched after the probes they refer to.

// Applications of the current plan sharing group, outcome and every
// covariate value.
struct CovariatePattern {
  std::string arm;                  // arm label
  std::string code;                 // current response code
  std::vector<std::string> values;  // one per CovariateTable::names
  int64_t applications = 0;
};

struct CovariateTable {
  std::vector<std::string> names;  // meta key "covariates", in the order given to the importer
  std::vector<CovariatePattern> patterns;
  int64_t applications_without = 0;  // applications of the plan lacking a value (none when imported whole)
};

// Empty names when the study has no covariates.
CovariateTable ReadCovariates(Store& store);

}  // namespace twinprobe
