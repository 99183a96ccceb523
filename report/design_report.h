#pragma once
// The design-integrity sections of a report, shared by `plan` (which prints
// the balance of the plan it stored) and the text and JSON reports: the
// balance tables (analysis/balance.h) and the pre-registration status with
// every deviation (analysis/deviations.h).
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/balance.h"
#include "analysis/deviations.h"

namespace twinprobe {

// "Balance of the plan …" with one small table per variable; "" without a plan.
std::string RenderBalanceText(const BalanceReport& balance);
nlohmann::json BalanceJson(const BalanceReport& balance);

// "Pre-registration …": the freeze, the deviations, what is exploratory.
std::string RenderPreregistrationText(const PreregistrationStatus& status);
nlohmann::json PreregistrationJson(const PreregistrationStatus& status);

}  // namespace twinprobe
