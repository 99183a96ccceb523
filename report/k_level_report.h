#pragma once
// Rendering of analysis/k_level.h (a factor with three or more levels, or
// two factors): the text section (text_report.cpp), the JSON object
// (json_report.cpp) and the sentences the plain summary and the HTML share.
// Every number of KLevelAnalysis appears in the JSON.
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"

namespace twinprobe {

// "" when result.k_levels is not present.
std::string RenderKLevelText(const AnalysisResult& result);
nlohmann::json KLevelJson(const KLevelAnalysis& k_levels);

// A level in a table: its display label with the code in parentheses
// ("aged 28 (28)"; the code is what the CSVs and the JSON hold), or the
// code alone when it has no label.
std::string LevelShown(const LevelRate& level);

// The overall test of one factor in words, naming the test and its
// sidedness, e.g. "Cochran's Q test of equal positive rates across the 3
// levels of age (exact permutation p) rejects equality: Q = 9.33 on 2 df,
// p = 0.0102." "" when the factor has none. With `records` (applicant
// records, AnalysisResult::records) the table counts applications, not probes.
std::string OverallSentence(const FactorAnalysis& factor, double alpha, bool records);
// The test of a factor varied between vacancies by re-assigning its levels
// to vacancies (analysis/vacancy_test.h) in words, ending by calling the k x
// 2 test descriptive; "" when the factor has none.
std::string VacancyTestSentence(const FactorAnalysis& factor, double alpha);
// The trend test in words, "" when the factor has no scores.
std::string TrendSentence(const FactorAnalysis& factor, double alpha, double confidence);
// One likelihood-ratio test of the two-factor model in words.
std::string EffectTestSentence(const EffectTest& test, double alpha);

}  // namespace twinprobe
