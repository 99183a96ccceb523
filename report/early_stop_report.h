#pragma once
// The early-stop block of analyze and the report (analysis/early_stop.h): the
// naive p-value and interval beside the stage-wise ordering p-value and the
// repeated confidence interval, with one sentence on why the naive ones
// overstate. Text, JSON and HTML say the same numbers in the same words.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/early_stop.h"

namespace twinprobe {

// "" when the study did not stop early.
std::string RenderEarlyStopText(const EarlyStop& e, const std::string& reference_label,
                                const std::string& other_label);
nlohmann::json EarlyStopJson(const EarlyStop& e);
// The body of the HTML part ("" when the study did not stop early).
std::string RenderEarlyStopHtml(const EarlyStop& e, const std::string& reference_label,
                                const std::string& other_label);

}  // namespace twinprobe
