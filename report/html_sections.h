#pragma once
// The sections of the HTML report, in page order (internal to report/).
//
// Each section is an id (the anchor and what tests look for), a title, a
// test of whether it applies to this result, and a body renderer. Sections
// built from several parts (the design section) keep a list of part
// renderers: rendering a new AnalysisResult field is one new function added
// to the list it belongs to. A part returns "" when its field is empty.
#include <string>
#include <vector>

#include "analysis/analyze.h"
#include "report/report_context.h"

namespace twinprobe {

using PartRenderer = std::string (*)(const AnalysisResult&, const ReportContext&);

struct HtmlSection {
  const char* id;
  const char* title;
  bool (*applies)(const AnalysisResult&);  // nullptr: always
  std::vector<PartRenderer> parts;         // rendered in order, empty results skipped
};

const std::vector<HtmlSection>& HtmlSections();

// Part renderers, grouped by the file that holds them.
// html_sections_results.cpp
std::string SummaryKeyFigures(const AnalysisResult&, const ReportContext&);
std::string SummaryParagraphs(const AnalysisResult&, const ReportContext&);
std::string RatesChart(const AnalysisResult&, const ReportContext&);
std::string PairedTable(const AnalysisResult&, const ReportContext&);
std::string PairedTest(const AnalysisResult&, const ReportContext&);
std::string StrataTables(const AnalysisResult&, const ReportContext&);
// html_sections_design.cpp
std::string DesignFactors(const AnalysisResult&, const ReportContext&);
std::string DesignCounts(const AnalysisResult&, const ReportContext&);
std::string DesignStrata(const AnalysisResult&, const ReportContext&);
std::string DesignIntegrity(const AnalysisResult&, const ReportContext&);
std::string DesignBalance(const AnalysisResult&, const ReportContext&);          // analysis/balance.h
std::string DesignPreregistration(const AnalysisResult&, const ReportContext&);  // analysis/deviations.h
// html_sections_responses.cpp
std::string ResponseCodes(const AnalysisResult&, const ReportContext&);
std::string ResponseTimesChart(const AnalysisResult&, const ReportContext&);
std::string EmployerTable(const AnalysisResult&, const ReportContext&);
// html_sections_effects.cpp (analysis/effects.h)
std::string PairedEffects(const AnalysisResult&, const ReportContext&);
std::string ComparisonsForest(const AnalysisResult&, const ReportContext&);
std::string StrataForest(const AnalysisResult&, const ReportContext&);
std::string AcrossStrataTable(const AnalysisResult&, const ReportContext&);
std::string SingleStrataNote(const AnalysisResult&, const ReportContext&);
// html_sections_sets.cpp (analysis/k_level.h, adjusted_model.h, employer_sets.h)
std::string LevelTests(const AnalysisResult&, const ReportContext&);
std::string LevelPairs(const AnalysisResult&, const ReportContext&);
std::string TwoFactorTable(const AnalysisResult&, const ReportContext&);
std::string AdjustedTable(const AnalysisResult&, const ReportContext&);
std::string EmployerSetsTable(const AnalysisResult&, const ReportContext&);
// html_sections_listing.cpp (analysis/listing_analysis.h)
std::string ListingOverview(const AnalysisResult&, const ReportContext&);
std::string ListingComparisons(const AnalysisResult&, const ReportContext&);
std::string ListingStrata(const AnalysisResult&, const ReportContext&);
std::string ListingStructure(const AnalysisResult&, const ReportContext&);
// html_sections_flow.cpp (analysis/flow.h, report/fieldwork_state.h)
std::string FlowDiagramPart(const AnalysisResult&, const ReportContext&);
// html_sections_about.cpp
std::string MethodsText(const AnalysisResult&, const ReportContext&);
std::string CautionsText(const AnalysisResult&, const ReportContext&);
std::string StampTable(const AnalysisResult&, const ReportContext&);

}  // namespace twinprobe
