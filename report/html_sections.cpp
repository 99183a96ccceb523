#include "report/html_sections.h"

namespace twinprobe {
namespace {

bool HasPaired(const AnalysisResult& r) { return r.has_paired; }
bool HasStrata(const AnalysisResult& r) { return (r.has_paired && !r.strata.empty()) || !r.effects.strata.empty(); }
// Several groups, or no pairs: every group against the reference.
bool HasComparisons(const AnalysisResult& r) { return !r.has_paired && !r.effects.comparisons.empty(); }
bool HasEmployers(const AnalysisResult& r) { return r.employers.available; }

}  // namespace

const std::vector<HtmlSection>& HtmlSections() {
  static const std::vector<HtmlSection> sections = {
      {"summary", "Summary", nullptr, {&SummaryKeyFigures, &SummaryParagraphs}},
      {"design", "How the test was designed", nullptr, {&DesignFactors, &DesignCounts, &DesignStrata, &DesignIntegrity}},
      {"rates", "Positive callbacks by group", nullptr, {&RatesChart}},
      {"paired", "Pairs: who was treated better", &HasPaired, {&PairedTable, &PairedTest, &PairedEffects}},
      {"comparisons", "Each group against the reference", &HasComparisons, {&ComparisonsForest}},
      {"strata", "Results within each stratum", &HasStrata, {&StrataForest, &StrataTables, &AcrossStrataTable}},
      {"responses", "What came back, and how fast", nullptr, {&ResponseCodes, &ResponseTimesChart}},
      {"employers", "Employers (by pseudonym)", &HasEmployers, {&EmployerTable}},
      {"methods", "Methods and sources", nullptr, {&MethodsText}},
      {"cautions", "Cautions", nullptr, {&CautionsText}},
      {"stamp", "Reproducibility", nullptr, {&StampTable}},
  };
  return sections;
}

}  // namespace twinprobe
