#pragma once
// What a study of applicant records (`import applications`,
// AnalysisResult::records) says in place of a design: the groups compared,
// which outcome values count as positive, the strata, and the files the
// records came from with their SHA-256. Records were never planned, sent or
// randomised, so there is no employer count, design hash, seed or
// observation window to show (the text, HTML and stamp of the report).
#include <string>
#include <utility>
#include <vector>

#include "analysis/analyze.h"

namespace twinprobe {

// "groups nord (reference), süd and øst of name origin" from the first
// factor's levels (display labels where the data give them).
std::string RecordsGroupsText(const AnalysisResult& result);

// "f.csv: 72 rows, SHA-256 5324…" for each imported file, in import order
// (a file's rejected rows named when there were any).
std::vector<std::string> RecordsFileLines(const AnalysisResult& result);

// The text report's lines, e.g.
// "Data: applicant records; groups nord (reference), süd and øst of name
// origin; a positive outcome is yes; strata town.\nImported from f.csv: 72
// rows, SHA-256 ….\n" (a blank line before).
std::string RecordsDataText(const AnalysisResult& result);

// The HTML design section's parts for records (html_sections.cpp): the
// groups with their applications, then the counts and the imported files.
std::string RecordsGroupsPart(const AnalysisResult& result);
std::string RecordsFactsPart(const AnalysisResult& result);

}  // namespace twinprobe
