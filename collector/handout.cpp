#include "collector/handout.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/input_file.h"
#include "core/office_records.h"
#include "core/safe_write.h"
#include "core/text.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

constexpr const char* kSelectFix =
    "choose the office's vacancies with --vacancies FILE (one vacancy reference a line) or --stratum NAME=VALUE";

Result<std::string> ReadWhole(const std::string& path) {
  if (Status s = CheckRegularInput(path); !s.ok()) return s.error();
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check that it exists and is readable");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

// The vacancy ids named by a file of references: one a line, blank lines
// and lines starting with '#' skipped.
Result<std::vector<int64_t>> VacanciesFromFile(const std::string& path, const std::vector<PlanVacancy>& plan) {
  auto text = ReadWhole(path);
  if (!text.ok()) return text.error();
  std::map<std::string, int64_t> by_ref;
  for (const PlanVacancy& v : plan) by_ref[v.ref] = v.id;
  std::vector<int64_t> ids;
  std::set<int64_t> seen;
  std::istringstream lines(text.value());
  std::string line;
  for (int n = 1; std::getline(lines, line); ++n) {
    const std::string ref(Trim(line));
    if (ref.empty() || ref[0] == '#') continue;
    auto it = by_ref.find(ref);
    const std::string where = path + ":" + std::to_string(n) + ":" + std::to_string(line.find(ref) + 1);
    if (it == by_ref.end())
      return BadInput(where, "'" + ref + "' is not a vacancy of the current plan",
                      "write one vacancy reference a line, as in the vacancies file's 'vacancy' column (e.g. V0001)");
    if (!seen.insert(it->second).second)
      return BadInput(where, "vacancy " + ref + " is listed twice", "list each vacancy once");
    ids.push_back(it->second);
  }
  if (ids.empty()) return BadInput(path, "names no vacancy", "write one vacancy reference a line (e.g. V0001)");
  std::sort(ids.begin(), ids.end());
  return ids;
}

Result<std::vector<int64_t>> VacanciesFromStratum(Store& main, const std::string& spec) {
  const size_t eq = spec.find('=');
  if (eq == std::string::npos || eq == 0 || eq + 1 == spec.size())
    return Error{ErrorKind::kUsage, "--stratum", "'" + spec + "' is not NAME=VALUE",
                 "give a stratum and its value, e.g. --stratum region=North"};
  const std::string name(Trim(spec.substr(0, eq))), value(Trim(spec.substr(eq + 1)));
  std::vector<std::string> values = StratumValues(main, name);
  if (values.empty())
    return BadInput("--stratum", "the plan has no stratum '" + name + "'",
                    "use one of the design's [strata] columns");
  if (std::find(values.begin(), values.end(), value) == values.end()) {
    std::string list;
    for (const std::string& v : values) list += (list.empty() ? "" : ", ") + v;
    return BadInput("--stratum", "no vacancy of the plan has " + name + " = '" + value + "'",
                    "use one of its values: " + list);
  }
  return VacanciesInStratum(main, name, value);
}

// The vacancies file cut to the handed-out references, header first.
Result<std::string> CutVacanciesFile(const std::string& path, const std::set<std::string>& refs) {
  auto table = ReadCsvFile(path);
  if (!table.ok()) return table.error();
  const int col = table.value().Column("vacancy");
  if (col < 0) return BadInput(path + ":1", "has no 'vacancy' column", "restore the vacancies file the plan was made from");
  auto line = [](const std::vector<std::string>& fields) {
    std::string out;
    for (size_t i = 0; i < fields.size(); ++i) out += (i ? "," : "") + CsvQuote(fields[i]);
    return out + "\n";
  };
  std::string out = line(table.value().header);
  for (const CsvRecord& r : table.value().rows)
    if (refs.count(r.fields[static_cast<size_t>(col)])) out += line(r.fields);
  return out;
}

Status CopyInto(const std::string& from_dir, const std::string& to_dir, const std::string& relative) {
  auto text = ReadWhole((fs::path(from_dir) / relative).string());
  if (!text.ok()) return text.error();
  const fs::path target = fs::path(to_dir) / relative;
  std::error_code ec;
  fs::create_directories(target.parent_path(), ec);
  return WriteFileSafely(target.string(), text.value());
}

// The design and the files it names, the ethics folder, and the materials.
Status WriteOfficeFiles(const std::string& study_dir, const std::string& office_dir, const Design& design,
                        const std::set<std::string>& refs, const std::vector<MaterialFileName>& materials) {
  std::vector<std::string> files = {"study.toml"};
  for (const NamePool& p : design.name_pools) files.push_back(p.file);
  for (const std::string& t : design.templates) files.push_back(t);
  std::error_code ec;
  const fs::path ethics = fs::path(study_dir) / "ethics";
  if (fs::is_directory(fs::symlink_status(ethics, ec)))
    for (const auto& entry : fs::recursive_directory_iterator(ethics, ec))
      if (fs::is_regular_file(entry.symlink_status()))
        files.push_back(fs::relative(entry.path(), study_dir).string());
  for (const MaterialFileName& m : materials)
    if (fs::path(m.folder).is_relative()) files.push_back((fs::path(m.folder) / m.file).string());
  for (const std::string& f : files)
    if (Status s = CopyInto(study_dir, office_dir, f); !s.ok()) return s;
  auto cut = CutVacanciesFile((fs::path(study_dir) / design.vacancies_file).string(), refs);
  if (!cut.ok()) return cut.error();
  const fs::path target = fs::path(office_dir) / design.vacancies_file;
  fs::create_directories(target.parent_path(), ec);
  return WriteFileSafely(target.string(), cut.value());
}

}  // namespace

Status CheckOfficeName(const std::string& name, const std::string& where) {
  const bool ok_chars = !name.empty() && name.size() <= 64 && name[0] != '.' &&
                        std::all_of(name.begin(), name.end(), [](unsigned char c) {
                          return std::isalnum(c) || c == '-' || c == '_' || c == '.';
                        });
  if (!ok_chars)
    return BadInput(where, "'" + name + "' cannot name an office",
                    "name the office folder with letters, digits, '-', '_' or '.' (e.g. offices/north-fen)");
  if (name == "main")
    return BadInput(where, "'main' is the main store's name in 'merge --prefer'", "name the office folder otherwise");
  return {};
}

Result<HandoutResult> HandOut(Store& main, const Design& design, const HandoutRequest& req) {
  if (req.vacancies_file.has_value() == req.stratum.has_value())
    return Error{ErrorKind::kUsage, "handout",
                 req.stratum ? "--vacancies and --stratum cannot be given together" : "no vacancies chosen", kSelectFix};
  HandoutResult result;
  result.folder = req.to;
  result.office = fs::path(req.to).lexically_normal().filename().string();
  if (result.office.empty()) result.office = fs::path(req.to).lexically_normal().parent_path().filename().string();
  if (Status s = CheckOfficeName(result.office, req.to); !s.ok()) return s.error();
  std::error_code ec;
  if (fs::exists(fs::symlink_status(req.to, ec)))
    return BadInput(req.to, "already exists", "hand out into a new folder (each office gets its own)");

  auto plan = ReadPlanIdentity(main);
  if (!plan) return BadInput(main.path(), "holds no plan to hand out", "run 'twinprobe plan' first");
  if (FindHandout(main, result.office))
    return BadInput(req.to, "an office named '" + result.office + "' already has a handout of this study",
                    "give each office its own folder name");
  const std::vector<PlanVacancy> vacancies = ReadPlanVacancies(main);
  auto chosen = req.vacancies_file ? VacanciesFromFile(*req.vacancies_file, vacancies)
                                   : VacanciesFromStratum(main, *req.stratum);
  if (!chosen.ok()) return chosen.error();
  std::map<int64_t, const PlanVacancy*> by_id;
  for (const PlanVacancy& v : vacancies) by_id[v.id] = &v;
  std::set<std::string> refs;
  std::map<std::string, std::vector<std::string>> taken;  // office -> its refs among the chosen
  for (int64_t id : chosen.value()) {
    const PlanVacancy& v = *by_id.at(id);
    refs.insert(v.ref);
    if (!v.office.empty()) taken[v.office].push_back(v.ref);
  }
  if (!taken.empty()) {
    const auto& [office, those] = *taken.begin();
    std::string list;
    for (size_t i = 0; i < those.size() && i < 5; ++i) list += (i ? ", " : "") + those[i];
    if (those.size() > 5) list += " …";
    return BadInput(req.vacancies_file ? *req.vacancies_file : "--stratum",
                    "these vacancies were handed out already, to office " + office + ": " + list,
                    "a vacancy is handed out once: leave them out of this office's list");
  }
  const std::vector<MaterialFileName> materials = ReadHandoutMaterialFiles(main, plan->plan_id, chosen.value());

  auto folder = SafeFolder::Create(req.to);
  if (!folder.ok()) return folder.error();
  AuditedWrite main_write(main, "handout");
  // Inside the main store's write lock nobody can hand the same vacancy out
  // meanwhile; the checks above ran on what was committed before it.
  for (const PlanVacancy& v : ReadPlanVacancies(main))
    if (!v.office.empty() && refs.count(v.ref))
      return BadInput(req.to, "vacancy " + v.ref + " was handed out to office " + v.office + " meanwhile",
                      "run the handout again without it");

  OfficeOrigin origin{result.office, plan->study_id, plan->plan_hash, AuditHead(main), main_write.at()};
  {
    const std::string office_db = (fs::path(folder.value()->path()) / "study.db").string();
    auto office = Store::Open(office_db, /*create=*/true);
    if (!office.ok()) return office.error();
    AttachedStore src(*office.value(), main.path(), "src");
    AuditedWrite office_write(*office.value(), "handout");
    result.probes = CopyPlanPart(*office.value(), plan->plan_id, chosen.value(), office_write.seq());
    InsertOfficeOrigin(*office.value(), office_write.seq(), origin);
    result.vacancies = static_cast<int64_t>(chosen.value().size());
    result.office_head = office_write.Commit(
        OfficeHandoutSummary(result.office, plan->plan_hash, result.vacancies, result.probes));
  }
  if (Status s = WriteOfficeFiles(req.study_dir, folder.value()->path(), design, refs, materials); !s.ok())
    return s.error();
  result.material_files = static_cast<int64_t>(materials.size());
  result.plan_hash = plan->plan_hash;

  HandoutRecord record;
  record.office = result.office;
  record.folder = req.to;
  record.plan_id = plan->plan_id;
  record.plan_hash = plan->plan_hash;
  record.office_head = result.office_head;
  record.handed_at = main_write.at();
  InsertHandout(main, main_write.seq(), record, chosen.value());
  if (Status s = folder.value()->Commit(); !s.ok()) return s.error();
  main_write.Commit(HandoutSummary(result.office, result.vacancies, result.probes, result.office_head));
  return result;
}

}  // namespace twinprobe
