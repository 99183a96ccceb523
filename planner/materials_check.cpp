#include "planner/materials_check.h"

#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/material_files.h"
#include "core/sha256.h"

namespace twinprobe {
namespace fs = std::filesystem;

namespace {

std::string ReadWhole(const fs::path& path, bool& ok) {
  std::ifstream in(path, std::ios::binary);
  ok = static_cast<bool>(in);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

std::string Shown(const std::string& study_dir, const std::string& folder, const std::string& file) {
  return (fs::path(folder).is_absolute() ? fs::path(folder) / file : fs::path(study_dir) / folder / file).string();
}

}  // namespace

Status CheckProbeMaterial(Store& store, const std::string& study_dir, const std::string& probe_ref) {
  ProbeMaterialFiles m = ReadProbeMaterialFiles(store, probe_ref);
  // An unknown probe is the caller's message to give (it knows the command).
  if (!m.probe_known || !m.last_rendered_plan) return {};
  const std::optional<int64_t> plan = CurrentPlanId(store);
  if (m.files.empty()) {
    std::string last = *m.last_rendered_plan == plan.value_or(0)
                           ? ""
                           : " (the last render was for plan " + std::to_string(*m.last_rendered_plan) + ")";
    return BadInput(Shown(study_dir, "materials", probe_ref + ".md"),
                    "probe " + probe_ref + " has no material rendered for plan " + std::to_string(plan.value_or(0)) +
                        last,
                    "run 'twinprobe render' to write this plan's materials, then send");
  }
  for (const auto& f : m.files) {
    std::string path = Shown(study_dir, f.folder, f.file);
    bool ok = false;
    std::string body = ReadWhole(path, ok);
    if (!ok)
      return BadInput(path, "the file rendered for probe " + probe_ref + " of plan " +
                                std::to_string(plan.value_or(0)) + " is missing",
                      "run 'twinprobe render --probe " + probe_ref + "' to write it again, then send");
    if (Sha256Hex(body) != f.sha256)
      return BadInput(path, "the file differs from the one rendered for probe " + probe_ref + " of plan " +
                                std::to_string(plan.value_or(0)) + " (its SHA-256 is not the sealed one)",
                      "run 'twinprobe render --probe " + probe_ref + "' to write it again, then send");
  }
  return {};
}

std::string MaterialFolderForStore(const std::string& study_dir, const std::string& out_dir) {
  std::error_code ec;
  fs::path study = fs::weakly_canonical(fs::absolute(study_dir, ec), ec);
  fs::path out = fs::weakly_canonical(fs::absolute(out_dir, ec), ec);
  fs::path rel = out.lexically_relative(study);
  if (!rel.empty() && *rel.begin() != "..") return rel.generic_string();
  return out.generic_string();
}

Result<std::optional<SupersededMove>> MoveSupersededMaterials(const std::string& study_dir,
                                                             std::optional<int64_t> previous_plan) {
  const fs::path dir = fs::path(study_dir) / "materials";
  const fs::path manifest = dir / "manifest.csv";
  if (!fs::exists(manifest)) return std::optional<SupersededMove>();
  SupersededMove move;
  move.old_plan = previous_plan.value_or(0);
  // The plan is the first column of every row (manifests before it had none).
  std::ifstream in(manifest);
  std::string header, first;
  std::getline(in, header);
  if (header.rfind("plan,", 0) == 0 && std::getline(in, first)) {
    try {
      move.old_plan = std::stoll(first.substr(0, first.find(',')));
    } catch (const std::exception&) {
    }
  }
  in.close();
  const fs::path to = dir / ("superseded-plan-" + std::to_string(move.old_plan));
  std::error_code ec;
  fs::create_directories(to, ec);
  if (ec)
    return BadInput(to.string(), "cannot create the folder for the old plan's materials: " + ec.message(),
                    "check the permissions of the materials folder, or move its files aside yourself");
  for (const auto& entry : fs::directory_iterator(dir)) {
    if (!entry.is_regular_file()) continue;
    fs::rename(entry.path(), to / entry.path().filename(), ec);
    if (ec)
      return BadInput(entry.path().string(), "cannot move the file to " + to.string() + ": " + ec.message(),
                      "check the permissions of the materials folder, or move its files aside yourself");
    ++move.files;
  }
  move.to = to.string();
  return std::optional<SupersededMove>(move);
}

}  // namespace twinprobe
