// Commands that set a study up: init, check, plan.
#include <filesystem>
#include <fstream>
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "planner/plan_store.h"
#include "planner/study_check.h"
#include "templates/embedded.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

// Writes the embedded example study into `dir`. Refuses to overwrite files.
Status WriteExampleStudy(const std::string& dir) {
  for (const auto& f : DemoStudyFiles()) {
    fs::path p = fs::path(dir) / std::string(f.path);
    if (fs::exists(p)) return BadInput(p.string(), "already exists", "init writes only into a folder without a study; choose another --study DIR");
  }
  for (const auto& f : DemoStudyFiles()) {
    fs::path p = fs::path(dir) / std::string(f.path);
    fs::create_directories(p.parent_path());
    std::ofstream out(p, std::ios::binary);
    out << f.content;
    if (!out) return BadInput(p.string(), "cannot write the file", "check that the folder is writable");
  }
  return {};
}

int RunInit(Context& ctx) {
  fs::create_directories(ctx.study_dir);
  Status s = WriteExampleStudy(ctx.study_dir);
  if (!s.ok()) return ReportError(s.error());
  if (ctx.json) {
    std::cout << nlohmann::json{{"study", ctx.study_dir}, {"files", DemoStudyFiles().size()}}.dump(2) << "\n";
  } else {
    std::cout << "Created an example study in " << ctx.study_dir << " (" << DemoStudyFiles().size()
              << " files: study.toml, vacancies.csv, name pools, templates).\n"
              << "It is the invented demo scenario: replace the names, templates and vacancies with your own,\n"
              << "fill in [ethics] with your board's approval, then run 'twinprobe check' and 'twinprobe plan'.\n";
  }
  return 0;
}

int RunCheck(Context& ctx) {
  auto study = CheckStudy(ctx.study_dir);
  if (!study.ok()) return ReportError(study.error());
  const auto& s = study.value();
  if (ctx.json) {
    nlohmann::json j{{"ok", true},
                     {"study_id", s.design.study_id},
                     {"kind", s.design.kind},
                     {"arms", s.design.arms.size()},
                     {"vacancies", s.vacancies.size()},
                     {"templates", s.design.templates.size()}};
    std::cout << j.dump(2) << "\n";
  } else {
    std::cout << "Design " << s.design.study_id << " is valid: " << s.design.kind << " design, "
              << s.design.arms.size() << " arms, " << s.vacancies.size() << " vacancies, "
              << s.design.templates.size() << " templates.\n";
  }
  return 0;
}

int RunPlan(Context& ctx) {
  auto study = CheckStudy(ctx.study_dir);
  if (!study.ok()) return ReportError(study.error());
  const auto& s = study.value();
  auto plan = AssignProbes(s.design, s.vacancies, s.pools);
  if (!plan.ok()) return ReportError(plan.error());
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  auto summary = StorePlan(*store.value(), s.design, s.vacancies, plan.value());
  if (!summary.ok()) return ReportError(summary.error());
  const auto& sum = summary.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"plan_id", sum.plan_id},
                                {"vacancies", sum.vacancies},
                                {"probes", sum.probes},
                                {"profiles", sum.profiles},
                                {"audit_hash", sum.audit_hash}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Planned " << sum.probes << " probes to " << sum.vacancies << " vacancies with " << sum.profiles
              << " profiles (plan " << sum.plan_id << ", store " << StorePath(ctx) << ").\n";
  }
  return 0;
}

void RegisterStudyCommands(CLI::App& app, Context& ctx) {
  app.add_subcommand("init", "Create an example study folder (design, vacancies, name pools, templates) to edit")
      ->callback([&ctx] { ctx.exit_code = RunInit(ctx); });
  app.add_subcommand("check", "Validate the design file, vacancies and name pools without writing anything")
      ->callback([&ctx] { ctx.exit_code = RunCheck(ctx); });
  app.add_subcommand("plan",
                     "Assign profiles, templates, send order and send times to every vacancy and store the plan")
      ->callback([&ctx] { ctx.exit_code = RunPlan(ctx); });
}

const bool kRegistered = RegisterCommand(10, &RegisterStudyCommands);

}  // namespace
}  // namespace twinprobe
