#pragma once
// The vacancies file (vacancies.csv): one row per real opening to be tested.
// Required columns: vacancy (a unique reference) and employer; optional:
// contact, opened_on (YYYY-MM-DD); plus every stratum column the design names.
#include <map>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

struct Vacancy {
  std::string ref;
  std::string employer;
  std::string contact;
  std::string opened_on;
  std::map<std::string, std::string> strata;
  // Every column of the row by its header name: the vacancy's template
  // fields ({{vacancy}}, {{employer}}, {{occupation}} …).
  std::map<std::string, std::string> fields;
  int64_t line = 0;  // line in the file, for messages
  std::string file;  // the file as opened (for messages); "" for vacancies made in memory
};

// Reads and validates the design's vacancies file under `study_dir`.
// Errors name FILE:LINE: a missing column, an empty or duplicate vacancy
// reference, an empty employer, a bad date, an empty stratum value.
Result<std::vector<Vacancy>> ReadVacancies(const std::string& study_dir, const Design& design);

}  // namespace twinprobe
