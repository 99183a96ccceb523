// `twinprobe render`: writes every probe's application documents (Markdown,
// plain text, HTML) from the templates and the stored plan, after proving
// once more that the probes of each set differ only in the tested attribute.
// Each file's SHA-256 and the plan are sealed in the audit chain (table
// material_file), so `schedule` and `sent` can refuse a file that is not the
// one rendered for the current plan, and after `purge` the store still proves
// what was sent.
#include <filesystem>
#include <iostream>
#include <set>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "core/audit.h"
#include "core/material_files.h"
#include "core/progress.h"
#include "planner/materials.h"
#include "planner/materials_check.h"
#include "planner/one_difference.h"
#include "planner/study_check.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

struct RenderOptions {
  std::string out;                  // default: STUDY/materials
  std::vector<std::string> probes;  // only these (default: all)
};

int RunRender(Context& ctx, const RenderOptions& o) {
  auto study = CheckStudy(ctx.study_dir);
  if (!study.ok()) return ReportError(study.error());
  const auto& s = study.value();
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto templates = LoadTemplates(ctx.study_dir, s.design);
  if (!templates.ok()) return ReportError(templates.error());
  // One transaction from reading the plan to sealing the files: a `plan`
  // running meanwhile cannot slip in between.
  AuditedWrite write(*store.value(), "render");
  const std::optional<int64_t> plan_id = CurrentPlanId(*store.value());
  auto materials = StoredMaterials(*store.value(), s.design, s.vacancies);
  if (!materials.ok()) return ReportError(materials.error());
  auto proof = ProveOneDifference(s.design, templates.value(), materials.value());
  if (!proof.ok()) return ReportError(proof.error());
  if (!proof.value().ok()) {
    for (const auto& leak : proof.value().leaks) ReportError(leak.AsError());
    return static_cast<int>(ExitCode::kBadInput);
  }
  std::vector<ProbeMaterial> chosen;
  if (o.probes.empty()) {
    chosen = materials.value();
  } else {
    std::set<std::string> wanted(o.probes.begin(), o.probes.end());
    for (const auto& m : materials.value())
      if (wanted.erase(m.probe_ref)) chosen.push_back(m);
    if (!wanted.empty())
      return ReportError(BadInput("", "unknown probe '" + *wanted.begin() + "'",
                                  "use a probe reference from 'twinprobe schedule' (e.g. P00001)"));
  }
  std::string out = o.out.empty() ? StudyPath(ctx, "materials") : o.out;
  Progress bar("rendering", static_cast<int64_t>(chosen.size()));
  auto written = WriteMaterials(out, plan_id.value_or(0), templates.value(), chosen, [&](size_t done, size_t total) {
    bar.SetTotal(static_cast<int64_t>(total));
    bar.Update(static_cast<int64_t>(done));
  });
  bar.Finish();
  if (!written.ok()) return ReportError(written.error());
  const auto& w = written.value();
  const std::string folder = MaterialFolderForStore(ctx.study_dir, out);
  std::vector<MaterialFileInsert> rows;
  rows.reserve(w.written.size());
  for (const auto& f : w.written) rows.push_back({f.probe_ref, folder, f.file, f.sha256});
  WriteMaterialFiles(*store.value(), write.seq(), rows);
  write.Commit("rendered " + std::to_string(w.probes) + " probes of plan " + std::to_string(plan_id.value_or(0)) +
               " into " + folder + "; manifest.csv SHA-256 " + w.manifest_sha256);
  if (ctx.json) {
    std::cout << nlohmann::json{{"out", out},           {"plan_id", plan_id.value_or(0)},
                                {"probes", w.probes},   {"files", w.files},
                                {"manifest", w.manifest}, {"manifest_sha256", w.manifest_sha256}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Rendered " << Count(w.probes, "probe", "probes") << " of plan " << plan_id.value_or(0) << " into " << out << " (" << w.files
              << " files: PROBE.md, PROBE.txt and PROBE.html each, and manifest.csv with their SHA-256).\n";
  }
  return 0;
}

}  // namespace

void RegisterRender(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<RenderOptions>();
  auto* render = app.add_subcommand(
      "render", "Write each probe's application (Markdown, plain text, HTML) from the templates into materials/");
  render->add_option("--out", o->out, "Folder for the documents (default: materials/ in the study folder)");
  render->add_option("--probe", o->probes, "Render only this probe (repeatable), e.g. --probe P00001");
  render->callback([&ctx, o] { ctx.exit_code = RunRender(ctx, *o); });
}

}  // namespace twinprobe
