// `twinprobe freeze`: pre-registers the design and the analysis plan by
// storing their SHA-256 (planner/freeze.h); reports list later deviations.
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "planner/design_file.h"
#include "planner/freeze.h"

namespace twinprobe {
namespace {

int RunFreeze(Context& ctx) {
  auto design = LoadDesign(ctx.study_dir);
  if (!design.ok()) return ReportError(design.error());
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  auto r = FreezeStudy(*store.value(), design.value());
  if (!r.ok()) return ReportError(r.error());
  const auto& f = r.value();
  if (f.sent_before > 0 || f.responses_before > 0)
    Warn("frozen after " + std::to_string(f.sent_before) + " probes were sent and " + std::to_string(f.responses_before) +
         " responses recorded: reports will say the registration is not prospective");
  if (ctx.json) {
    std::cout << nlohmann::json{{"frozen_at", f.at},
                                {"design_sha256", f.design_sha256},
                                {"analysis_sha256", f.analysis_sha256},
                                {"analysis_plan", f.analysis_plan},
                                {"sent_before", f.sent_before},
                                {"responses_before", f.responses_before},
                                {"audit_hash", f.audit_hash}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Frozen at " << f.at << ".\n"
              << "  design sha256        " << f.design_sha256 << "\n"
              << "  analysis plan sha256 " << f.analysis_sha256 << "\n"
              << "Deposit these two hashes with your pre-registration. From now on every report lists each change\n"
              << "to the design or the analysis plan as a deviation and marks what it touches as exploratory.\n";
  }
  return 0;
}

}  // namespace

void RegisterFreeze(CLI::App& app, Context& ctx) {
  app.add_subcommand("freeze",
                     "Pre-register: store and print the SHA-256 of the design and of the analysis plan; later changes "
                     "show as deviations")
      ->callback([&ctx] { ctx.exit_code = RunFreeze(ctx); });
}

}  // namespace twinprobe
