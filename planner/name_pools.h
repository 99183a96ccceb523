#pragma once
// Name pools: CSV files in the study folder, one per level of the name
// factor (or per combination of levels when names signal several factors).
// Required columns given_name and family_name; every further column is a
// profile field the templates may use (e.g. hometown). Such a field is not
// controlled by a factor unless [templates].factor_fields lists it, so
// `check` reports it when it differs between the probes of a set.
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

struct NameList {
  std::string file;  // as written in the design, relative to the study folder
  std::string path;  // the file as opened (study folder + file), for messages
  std::vector<std::pair<std::string, std::string>> names;  // given, family
  std::vector<std::string> extra_columns;                    // further columns, in file order
  std::vector<std::vector<std::string>> extra;               // per name: values of extra_columns
  std::vector<int64_t> lines;                                // per name: its line in the file
};

// Reads the design's name pools, in design order. Errors name FILE:LINE: a
// missing given_name/family_name column, an empty name, a name listed twice,
// an extra column whose name is not a field name or is reserved, an empty pool.
Result<std::vector<NameList>> ReadNamePools(const std::string& study_dir, const Design& design);

// True for names usable as template fields: a letter or '_' then letters,
// digits or '_'.
bool IsFieldName(const std::string& name);

// The profile fields every profile has (derived from the name and the contact
// patterns): given_name, family_name, full_name, mailbox, phone.
const std::vector<std::string>& IdentityFields();

}  // namespace twinprobe
