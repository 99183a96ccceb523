// `twinprobe freeze`: pre-registers the design, the analysis plan (with the
// monitoring plan) and every input file of the analysis by storing their
// SHA-256 (planner/freeze.h); reports list later deviations by file and key.
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "planner/design_file.h"
#include "planner/freeze.h"
#include "core/terminal_text.h"
#include "report/plural.h"

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
  const std::vector<FrozenInput> inputs = ParseInputs(f.inputs);
  if (ctx.json) {
    nlohmann::json files = nlohmann::json::array();
    for (const FrozenInput& i : inputs)
      files.push_back({{"role", i.role}, {"file", i.file}, {"sha256", i.sha256}, {"records", i.records.size()}});
    std::cout << nlohmann::json{{"frozen_at", f.at},
                                {"inputs", files},
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
              << "Inputs frozen with them (each file's sha256, and each key, vacancy or line within it):\n";
    for (const FrozenInput& i : inputs)
      std::cout << "  " << ForTerminal(i.file) << " (" << i.role << ", " << Count(static_cast<int64_t>(i.records.size()),
                                                                                   "record", "records")
                << ") " << (i.sha256.empty() ? "unreadable" : i.sha256.substr(0, 16)) << "\n";
    std::cout << "Deposit the two hashes with your pre-registration. From now on every report lists each change to\n"
              << "the design, the analysis plan, the monitoring plan or an input file as a deviation, by file and\n"
              << "key, and marks what it touches as exploratory.\n";
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
