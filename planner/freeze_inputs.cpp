#include "planner/freeze_inputs.h"

#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

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

FrozenInput FileInput(const std::string& role, const std::string& file, const std::string& study_dir,
                      bool keyed_by_first_column) {
  FrozenInput f{role, file, "", {}};
  auto text = ReadWhole(study_dir, file);
  if (!text) return f;
  f.sha256 = Sha256Hex(*text);
  const std::vector<std::string> lines = Lines(*text);
  for (size_t i = 0; i < lines.size(); ++i) {
    std::string key = "line " + std::to_string(i + 1);
    // A vacancy is named by its id (the first column), so a cut list reads
    // as the vacancies removed, not as every later line changed.
    if (keyed_by_first_column && i > 0) {
      std::string first = lines[i].substr(0, lines[i].find(','));
      if (first.size() >= 2 && first.front() == '"' && first.back() == '"') first = first.substr(1, first.size() - 2);
      if (!first.empty()) key = first;
    }
    if (keyed_by_first_column && i == 0) key = "header";
    f.records.emplace_back(key, Digest(lines[i]));
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
  if (!design.vacancies_file.empty()) out.push_back(FileInput("vacancies", design.vacancies_file, study_dir, true));
  for (const NamePool& pool : design.name_pools) out.push_back(FileInput("name_pool", pool.file, study_dir, false));
  for (const std::string& t : design.templates) out.push_back(FileInput("template", t, study_dir, false));
  return out;
}

}  // namespace twinprobe
