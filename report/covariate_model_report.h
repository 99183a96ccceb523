#pragma once
// The groups' odds ratios adjusted for the applications' covariates
// (analysis/covariate_model.h) as text, JSON and an HTML part, with the
// sentences that say what the adjustment removes and what it does not.
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

// "" when the study has no covariates.
std::string RenderCovariateModelText(const AnalysisResult& r);
nlohmann::json CovariateModelJson(const CovariateModel& m);
std::string CovariateModelPart(const AnalysisResult& r, const ReportContext& ctx);

// What the adjustment removes and what it does not, in two sentences each
// renderer prints.
std::string CovariateAdjustmentRemoves(const CovariateModel& m);
std::string CovariateAdjustmentKeeps();

}  // namespace twinprobe
