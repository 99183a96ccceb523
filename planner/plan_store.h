#pragma once
// Writing a plan into the study store, as one audited command.
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"
#include "planner/assign.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct PlanSummary {
  int64_t plan_id = 0;
  int64_t vacancies = 0;
  int64_t probes = 0;
  int64_t profiles = 0;
  std::string audit_hash;
};

// Stores the design's factors, arms and the plan (vacancies with strata and
// pseudonymous employers, profiles, probes). Refuses with a bad-input error
// when any probe of the current plan was sent or has a response, because a
// plan in the field must not change. Everything lands in one transaction.
Result<PlanSummary> StorePlan(Store& store, const Design& design, const std::vector<Vacancy>& vacancies,
                              const Plan& plan);

}  // namespace twinprobe
