#include "planner/vacancies.h"

#include <algorithm>
#include <filesystem>
#include <unordered_map>

#include "core/clock.h"
#include "core/csv.h"
#include "core/echoed_value.h"
#include "planner/design_file.h"

namespace twinprobe {

Result<std::vector<Vacancy>> ReadVacancies(const std::string& study_dir, const Design& design) {
  std::string path = (std::filesystem::path(study_dir) / design.vacancies_file).string();
  // Bound the plan before it is built: the vacancies past the most a plan can
  // hold are counted, not kept.
  const int64_t per_set = design.kind == "unpaired" ? 1 : std::max<int64_t>(1, static_cast<int64_t>(design.arms.size()));
  const size_t most_vacancies = static_cast<size_t>(kMaxProbes / per_set);
  auto table = ReadCsvFile(path, most_vacancies);
  if (!table.ok()) return table.error();
  const CsvTable& t = table.value();
  if (t.row_count > most_vacancies)
    return BadInput(path,
                    "the plan would have " + WithThousands(t.row_count * static_cast<size_t>(per_set)) + " probes (" +
                        WithThousands(t.row_count) + " vacancies \u00d7 " + std::to_string(per_set) +
                        (per_set == 1 ? " probe" : " probes") + " each), more than the " +
                        WithThousands(static_cast<size_t>(kMaxProbes)) + " a plan may have",
                    "split the vacancies into studies of at most " + WithThousands(most_vacancies) + " vacancies");
  int c_ref = t.Column("vacancy"), c_emp = t.Column("employer"), c_contact = t.Column("contact"),
      c_open = t.Column("opened_on");
  if (c_ref < 0) return BadInput(path + ":1", "the column 'vacancy' is missing", "add a column 'vacancy' with a unique reference per opening");
  if (c_emp < 0) return BadInput(path + ":1", "the column 'employer' is missing", "add a column 'employer'");
  std::vector<int> c_strata;
  for (const auto& s : design.strata) {
    int c = t.Column(s);
    if (c < 0)
      return BadInput(path + ":1", "the stratum column '" + s + "' named in [strata] is missing",
                      "add the column or remove it from [strata].columns");
    c_strata.push_back(c);
  }
  std::vector<Vacancy> out;
  std::unordered_map<std::string, int64_t> seen;
  for (const auto& row : t.rows) {
    std::string where = path + ":" + std::to_string(row.line);
    Vacancy v;
    v.line = row.line;
    v.file = path;
    v.ref = row.fields[c_ref];
    v.employer = row.fields[c_emp];
    if (c_contact >= 0) v.contact = row.fields[c_contact];
    if (c_open >= 0) v.opened_on = row.fields[c_open];
    for (size_t c = 0; c < t.header.size(); ++c) v.fields[t.header[c]] = row.fields[c];
    if (v.ref.empty()) return BadInput(where, "the vacancy reference is empty", "give every vacancy a unique reference");
    if (auto it = seen.find(v.ref); it != seen.end())
      return BadInput(where, "vacancy '" + v.ref + "' appears twice (first on line " + std::to_string(it->second) + ")",
                      "give each vacancy a unique reference");
    seen[v.ref] = row.line;
    if (v.employer.empty()) return BadInput(where, "vacancy '" + v.ref + "' has no employer", "fill in the employer");
    if (!v.opened_on.empty() && !ParseIsoTime(v.opened_on))
      return BadInput(where, "opened_on '" + v.opened_on + "' " + WhyNotATime(v.opened_on, "is not a date"),
                      "write it as YYYY-MM-DD");
    for (size_t i = 0; i < c_strata.size(); ++i) {
      const std::string& val = row.fields[c_strata[i]];
      if (val.empty())
        return BadInput(where, "vacancy '" + v.ref + "' has no value for stratum '" + design.strata[i] + "'",
                        "fill it in (use 'unknown' if it is not known)");
      v.strata[design.strata[i]] = val;
    }
    out.push_back(std::move(v));
  }
  if (out.empty()) return BadInput(path, "the vacancies file lists no vacancy", "add one row per opening");
  return out;
}

}  // namespace twinprobe
