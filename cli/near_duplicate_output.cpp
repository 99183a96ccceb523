#include "cli/near_duplicate_output.h"

#include "cli/command.h"
#include "report/plural.h"

namespace twinprobe {

std::string NearDuplicateWarning(const NearDuplicate& d, const std::string& one, const std::string& many) {
  std::string list;
  for (size_t i = 0; i < d.spellings.size(); ++i) {
    if (i > 0) list += i + 1 == d.spellings.size() ? " and " : ", ";
    list += "'" + d.spellings[i].text + "' (" + Count(d.spellings[i].count, one, many) + ")";
  }
  const size_t n = d.spellings.size();
  return "the column '" + d.column + "' holds " + list + ", which differ only in case or spaces and so count as " +
         (n == 2 ? std::string("two") : std::to_string(n)) + " values; write them alike if they are one";
}

void WarnNearDuplicates(const std::vector<NearDuplicate>& found, const std::string& one, const std::string& many) {
  for (const NearDuplicate& d : found) Warn(NearDuplicateWarning(d, one, many));
}

}  // namespace twinprobe
