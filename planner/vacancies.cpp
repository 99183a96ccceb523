#include "planner/vacancies.h"

#include <filesystem>
#include <unordered_map>

#include "core/clock.h"
#include "core/csv.h"

namespace twinprobe {

Result<std::vector<Vacancy>> ReadVacancies(const std::string& study_dir, const Design& design) {
  std::string path = (std::filesystem::path(study_dir) / design.vacancies_file).string();
  auto table = ReadCsvFile(path);
  if (!table.ok()) return table.error();
  const CsvTable& t = table.value();
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
      return BadInput(where, "opened_on '" + v.opened_on + "' is not a date", "write it as YYYY-MM-DD");
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
