#include "report/html_sections.h"

#include "report/fieldwork_state.h"
#include "report/records_data.h"
#include "report/declines_report.h"
#include "report/covariate_model_report.h"
#include "report/stages_report.h"
#include "report/strata_appendix.h"

namespace twinprobe {
namespace {

bool HasStrata(const AnalysisResult& r) {
  return EarlyStateSentence(r).empty() &&
         ((r.has_paired && !r.strata.empty()) || !r.effects.strata.empty() || !r.effects.single_strata.empty());
}
// Several groups, or no pairs: every group against the reference.
bool HasComparisons(const AnalysisResult& r) {
  return !r.has_paired && !r.effects.comparisons.empty() && EarlyStateSentence(r).empty();
}
bool HasEmployers(const AnalysisResult& r) { return r.employers.available && EarlyStateSentence(r).empty(); }
bool HasListings(const AnalysisResult& r) { return r.listings.present; }
// A store with ranked lists only has no design, rates or responses.
bool HasPlan(const AnalysisResult& r) { return !r.listings.listing_only; }
// Applicant records have no design to describe: their own section says what the data are.
bool HasRecords(const AnalysisResult& r) { return HasPlan(r) && r.records; }
bool HasDesign(const AnalysisResult& r) { return HasPlan(r) && !r.records; }
std::string RecordsGroups(const AnalysisResult& r, const ReportContext&) { return RecordsGroupsPart(r); }
std::string RecordsFacts(const AnalysisResult& r, const ReportContext&) { return RecordsFactsPart(r); }
// Nothing sent or nothing closed yet: no rates, tables or employer findings.
bool HasFindings(const AnalysisResult& r) { return HasPlan(r) && EarlyStateSentence(r).empty(); }
// Records have no sending or callbacks: their rates get their own title, and
// the response-time section only when the file gave send and response times.
bool HasTestFindings(const AnalysisResult& r) { return HasFindings(r) && !r.records; }
bool HasRecordsFindings(const AnalysisResult& r) { return HasFindings(r) && r.records; }
bool HasTimedFindings(const AnalysisResult& r) {
  return HasFindings(r) && (!r.records || r.response_times.available);
}
bool HasPairedFindings(const AnalysisResult& r) { return r.has_paired && HasFindings(r); }
bool HasStages(const AnalysisResult& r) { return r.stages.present && HasFindings(r); }
bool HasKLevels(const AnalysisResult& r) { return r.k_levels.present && HasFindings(r); }
bool HasAdjusted(const AnalysisResult& r) { return r.adjusted.present && HasFindings(r); }
bool HasCovariateModel(const AnalysisResult& r) { return r.covariate_model.present && HasFindings(r); }
bool HasStrataAppendixFindings(const AnalysisResult& r) { return HasStrataAppendix(r) && HasFindings(r); }
bool HasEmployerSets(const AnalysisResult& r) { return r.employer_sets.available && HasFindings(r); }

}  // namespace

const std::vector<HtmlSection>& HtmlSections() {
  static const std::vector<HtmlSection> sections = {
      {"summary", "Summary", nullptr, {&SummaryKeyFigures, &SummaryParagraphs}},
      {"design", "The data", &HasRecords, {&RecordsGroups, &RecordsFacts, &DesignStrata, &DesignPreregistration}},
      {"design", "How the test was designed", &HasDesign,
       {&DesignFactors, &DesignCounts, &DesignStrata, &DesignIntegrity, &DesignBalance, &DesignPreregistration}},
      {"flow", "Flow of the study", &HasDesign, {&FlowDiagramPart}},
      {"rates", "Positive callbacks by group", &HasTestFindings, {&RatesChart}},
      {"rates", "Positive outcomes by group", &HasRecordsFindings, {&RatesChart}},
      {"paired", "Pairs: who was treated better", &HasPairedFindings, {&PairedTable, &PairedTest, &PairedEffects}},
      {"comparisons", "Each group against the reference", &HasComparisons, {&ComparisonsForest}},
      {"strata", "Results within each stratum", &HasStrata, {&SingleStrataNote, &StrataForest, &StrataTables, &AcrossStrataTable}},
      {"stages", "Hiring stages", &HasStages, {&StagesFunnel}},
      {"levels", "Every level compared", &HasKLevels, {&LevelTests, &LevelPairs, &TwoFactorTable}},
      {"adjusted", "Adjusted for template and send position", &HasAdjusted, {&AdjustedTable}},
      {"covariates", "Adjusted for the applications' covariates", &HasCovariateModel, {&CovariateModelPart}},
      {"responses", "What came back, and how fast", &HasTimedFindings, {&ResponseCodes, &ResponseTimesChart}},
      {"declines", "Declines of positive responses", &HasDeclines, {&DeclinesSection}},
      {"employers", "Employers (by pseudonym)", &HasEmployers, {&EmployerTable}},
      {"employers-sets", "Employers (by pseudonym)", &HasEmployerSets, {&EmployerSetsTable}},
      {"listing-audit", "Ranked listings (listing audit)", &HasListings,
       {&ListingOverview, &ListingComparisons, &ListingStrata, &ListingStructure}},
      {"methods", "Methods and sources", nullptr, {&MethodsText}},
      {"cautions", "Cautions", nullptr, {&CautionsText}},
      {"stamp", "Reproducibility", nullptr, {&StampTable}},
      {"appendix-strata", "Appendix: each stratum's table", &HasStrataAppendixFindings, {&StrataAppendix}},
  };
  return sections;
}

}  // namespace twinprobe
