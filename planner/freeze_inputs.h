#pragma once
// The input files of the analysis as they are now, for `freeze` to store and
// for `analyze` to compare with what was frozen (analysis/deviations.h): the
// design file (one record per key, e.g. "[analysis].alpha"), the vacancy
// file (one record per vacancy id, over the id, opened_on and the strata
// columns: the identifying columns `purge` rewrites are left out), each name
// pool and each template (one record per line, "line 7"). Reads files only; a file that cannot be read
// is listed with an empty SHA-256 and no records.
#include <string>
#include <vector>

#include "core/design.h"
#include "core/read_freeze.h"

namespace twinprobe {

std::vector<FrozenInput> ReadAnalysisInputs(const Design& design, const std::string& study_dir);

}  // namespace twinprobe
