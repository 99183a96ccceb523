#include "planner/freeze_inputs.h"

#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "core/csv.h"
#include "core/sha256.h"

namespace twinprobe {
namespace {

namespace fs = std::filesystem;

std::string Digest(const std::string& s) { return Sha256Hex(s).substr(0, 16); }

std::optional<std::string> ReadWhole(const std::string& study_dir, const std::string& file) {
  fs::path p(file);
  if (p.is_relative()) p = fs::path(study_dir) / p;
  std::ifstream in(p, std::ios::binary);
  if (!in) return std::nullopt;
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> out;
  size_t pos = 0;
  while (pos < text.size()) {
    size_t end = text.find('\n', pos);
    if (end == std::string::npos) end = text.size();
    std::string line = text.substr(pos, end - pos);
    if (!line.empty() && line.back() == '\r') line.pop_back();
    out.push_back(std::move(line));
    pos = end + 1;
  }
  return out;
}

// A name pool or template: one record per line.
FrozenInput LinesInput(const std::string& role, const std::string& file, const std::string& study_dir) {
  FrozenInput f{role, file, "", {}};
  auto text = ReadWhole(study_dir, file);
  if (!text) return f;
  f.sha256 = Sha256Hex(*text);
  const std::vector<std::string> lines = Lines(*text);
  for (size_t i = 0; i < lines.size(); ++i) f.records.emplace_back("line " + std::to_string(i + 1), Digest(lines[i]));
  return f;
}

// The vacancy file: one record per vacancy, named by its id, over the columns
// the analysis uses (the id, opened_on and the strata). The identifying
// columns are left out: `purge` rewrites them (employer names become
// pseudonyms, contacts are emptied) and that is data protection, not a
// deviation. A file that is not readable CSV counts by its lines.
FrozenInput VacanciesInput(const Design& design, const std::string& study_dir) {
  const std::string& file = design.vacancies_file;
  auto text = ReadWhole(study_dir, file);
  if (!text) return FrozenInput{"vacancies", file, "", {}};
  auto table = ReadCsvText(*text, file);
  if (!table.ok()) return LinesInput("vacancies", file, study_dir);
  FrozenInput f{"vacancies", file, Sha256Hex(*text), {}};
  const CsvTable& t = table.value();
  std::vector<std::string> columns = {"vacancy", "opened_on"};
  columns.insert(columns.end(), design.strata.begin(), design.strata.end());
  std::vector<int> at;
  for (const std::string& c : columns) at.push_back(t.Column(c));
  const int id = t.Column("vacancy");
  for (size_t r = 0; r < t.rows.size(); ++r) {
    const std::vector<std::string>& fields = t.rows[r].fields;
    std::string record;
    for (size_t k = 0; k < columns.size(); ++k)
      record += columns[k] + "=" + (at[k] >= 0 && static_cast<size_t>(at[k]) < fields.size() ? fields[at[k]] : "") + "\n";
    const std::string key = id >= 0 && static_cast<size_t>(id) < fields.size() && !fields[id].empty()
                                ? fields[id]
                                : "row " + std::to_string(r + 1);
    f.records.emplace_back(key, Digest(record));
  }
  return f;
}

// The design's keys from its canonical JSON: "[section].key" for a table,
// "[[section]] N.key" for the N-th table of an array of tables.
void DesignRecords(const nlohmann::json& root, FrozenInput& f) {
  for (const auto& [section, value] : root.items()) {
    if (value.is_object()) {
      for (const auto& [key, v] : value.items()) f.records.emplace_back("[" + section + "]." + key, Digest(v.dump()));
    } else if (value.is_array() && !value.empty() && value.front().is_object()) {
      for (size_t i = 0; i < value.size(); ++i)
        for (const auto& [key, v] : value[i].items())
          f.records.emplace_back("[[" + section + "]] " + std::to_string(i + 1) + "." + key, Digest(v.dump()));
    } else {
      f.records.emplace_back(section, Digest(value.dump()));
    }
  }
}

}  // namespace

std::vector<FrozenInput> ReadAnalysisInputs(const Design& design, const std::string& study_dir) {
  std::vector<FrozenInput> out;
  FrozenInput d{"design", "study.toml", Sha256Hex(design.canonical), {}};
  const nlohmann::json root = nlohmann::json::parse(design.canonical, nullptr, false);
  if (!root.is_discarded()) DesignRecords(root, d);
  out.push_back(std::move(d));
  if (!design.vacancies_file.empty()) out.push_back(VacanciesInput(design, study_dir));
  for (const NamePool& pool : design.name_pools) out.push_back(LinesInput("name_pool", pool.file, study_dir));
  for (const std::string& t : design.templates) out.push_back(LinesInput("template", t, study_dir));
  return out;
}

}  // namespace twinprobe
