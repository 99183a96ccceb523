// `twinprobe demo`: the whole pipeline on an embedded, invented scenario.
// It writes the example study, plans it with the real planner, simulates the
// employers' responses from a stated model with a fixed seed, records them
// through the normal recording path, analyses and writes the report.
#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iostream>

#include "analysis/analyze.h"
#include "analysis/listing_analysis.h"
#include "report/plural.h"
#include "cli/command.h"
#include "collector/import_ranks.h"
#include "collector/responses.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/plan_probes.h"
#include "core/pseudonym.h"
#include "core/sha256.h"
#include "cli/report_cmd.h"
#include "report/html_report.h"
#include "planner/freeze.h"
#include "planner/plan_store.h"
#include "planner/study_check.h"
#include "report/json_report.h"
#include "report/text_report.h"
#include "stats/random.h"
#include "templates/embedded.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

constexpr const char* kMarker = ".twinprobe-demo";

// The simulation model (invented; it exists to give the demo a known truth).
// A vacancy's employer is "responsive" with a probability that depends on the
// occupation; a responsive employer calls back an inland-named applicant with
// probability 0.60 and a coastal-named one with 0.42, independently. So the
// true positive-callback rates are 0.2775 (inland) and 0.1943 (coastal), a
// rate ratio of 1.43, and among discordant pairs inland is favoured with
// probability 0.60*0.58 / (0.60*0.58 + 0.42*0.40) = 0.674.
struct DemoModel {
  double Responsive(const std::string& occupation) const {
    if (occupation == "bookkeeper") return 0.40;
    if (occupation == "warehouse clerk") return 0.50;
    if (occupation == "care assistant") return 0.60;
    return 0.35;  // junior developer
  }
  double inland_callback = 0.60;
  double coastal_callback = 0.42;
  double rejection_given_negative = 0.35;
  uint64_t seed = 9001;
};

Status PrepareFolder(const std::string& dir) {
  if (fs::exists(dir) && !fs::is_empty(dir)) {
    if (!fs::exists(fs::path(dir) / kMarker))
      return BadInput(dir, "the folder exists and is not an earlier demo",
                      "choose another folder with --out DIR (demo never overwrites your files)");
    fs::remove_all(dir);
  }
  fs::create_directories(dir);
  std::ofstream(fs::path(dir) / kMarker) << "made by 'twinprobe demo'; the next demo run may replace this folder\n";
  return WriteExampleStudyFiles(dir);
}

// Sends every planned probe and records the simulated responses in one
// audited command, through the same AddResponse that `record` uses.
// `season_end` receives the end of the simulated season: the last sending
// plus the observation window (every simulated answer falls within it).
int64_t SimulateFieldwork(Store& store, const OutcomeScheme& scheme, const DemoModel& model, int64_t& season_end) {
  stats::Rng rng(model.seed);
  AuditedWrite write(store, "demo simulate");
  const std::vector<PlannedProbeRow> rows = ReadPlannedProbes(store, "occupation");
  PlannedSendingWriter sendings(store);
  int64_t recorded = 0;
  int64_t current_vacancy = -1;
  bool responsive = false;
  for (const auto& r : rows) {
    sendings.Insert(write.seq(), r.id, r.planned_at, "demo", write.at());
    season_end = std::max(season_end, *ParseIsoTime(r.planned_at) + int64_t{scheme.window_days} * 86400);
    if (r.vacancy_id != current_vacancy) {
      current_vacancy = r.vacancy_id;
      responsive = rng.Bernoulli(model.Responsive(r.stratum_value));
    }
    bool inland = r.arm_label.find("inland") != std::string::npos;
    bool positive = responsive && rng.Bernoulli(inland ? model.inland_callback : model.coastal_callback);
    std::string code;
    if (positive) code = rng.Bernoulli(0.7) ? "invitation" : "info_request";
    else if (rng.Bernoulli(model.rejection_given_negative)) code = "rejection";
    else continue;  // no response at all within the window
    int64_t sent = *ParseIsoTime(r.planned_at);
    int64_t received = sent + 86400 * rng.Between(1, 14) + rng.Between(0, 8 * 3600);
    ResponseEntry e{r.ref, code, FormatIsoTime(received), rng.Bernoulli(0.8) ? "mail" : "phone", "", "demo"};
    // The simulated season runs on its own clock: at the moment each answer
    // arrives, it has happened (the real clock may be before the season).
    ResponseRules rules;
    rules.now = received;
    auto added = AddResponse(store, scheme, e, write.seq(), "demo", write.at(), "demo", rules);
    if (!added.ok()) throw std::runtime_error("demo simulation: " + added.error().Message());
    ++recorded;
  }
  write.Commit("demo: sent " + std::to_string(rows.size()) + " probes, recorded " + std::to_string(recorded) +
               " simulated responses");
  return recorded;
}

int RunDemo(Context& ctx, const std::string& out_dir) {
  Status prepared = PrepareFolder(out_dir);
  if (!prepared.ok()) return ReportError(prepared.error());
  ctx.study_dir = out_dir;
  auto study = CheckStudy(out_dir);
  if (!study.ok()) return ReportError(study.error());
  const CheckedStudy& s = study.value();
  auto plan = AssignProbes(s.design, s.vacancies, s.pools);
  if (!plan.ok()) return ReportError(plan.error());
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  {
    // The demo's employers are invented; a pseudonym key fixed by the demo's
    // seed makes its pseudonyms, and so its reports, repeat exactly. Real
    // studies get a random key on first use (core/pseudonym.cpp).
    Transaction tx(*store.value());
    SeedEmployerKeySecret(*store.value(), Sha256Hex("twinprobe demo employer key " + std::to_string(DemoModel{}.seed)));
    tx.Commit();
  }
  auto planned = StorePlan(*store.value(), s.design, s.vacancies, plan.value());
  if (!planned.ok()) return ReportError(planned.error());
  // Pre-register before any fieldwork, as a real study should (docs/freeze.md),
  // so the report shows a prospective registration and no deviations.
  auto frozen = FreezeStudy(*store.value(), s.design);
  if (!frozen.ok()) return ReportError(frozen.error());
  DemoModel model;
  int64_t season_end = 0;
  int64_t responses = SimulateFieldwork(*store.value(), s.design.outcomes, model, season_end);
  // The listing-audit part: invented candidate rankings of an invented job
  // board (templates/demo/listings/generate_ranks.py states the model).
  auto ranks = ImportRanksFile(*store.value(), (fs::path(out_dir) / "listings" / "ranks.csv").string(),
                               TerminalProgress("import ranks"));
  if (!ranks.ok()) return ReportError(ranks.error());
  // The simulated season lies in the future of the computer's clock: the
  // demo analyses it as of the season's end, when every window has closed
  // (a later `analyze` does the same with TWINPROBE_NOW set to that time).
  auto result = AnalyzeStore(*store.value(), s.design.outcomes, s.design.analysis, &s.design, season_end);
  if (!result.ok()) return ReportError(result.error());

  fs::create_directories(fs::path(out_dir) / "reports");
  std::string text_path = (fs::path(out_dir) / "reports" / "report.txt").string();
  std::string json_path = (fs::path(out_dir) / "reports" / "report.json").string();
  std::ofstream(text_path) << RenderTextReport(result.value());
  std::ofstream(json_path) << RenderJsonReport(result.value());
  AuditReport audit = VerifyAudit(*store.value());
  std::string html_path = (fs::path(out_dir) / "reports" / "report.html").string();
  std::ofstream(html_path) << RenderHtmlReport(result.value(), StudyReportContext(ctx, *store.value(), false));

  if (ctx.json) {
    std::cout << RenderJsonReport(result.value());
    return 0;
  }
  std::cout << "twinprobe demo: an invented study in the invented country of Veldmark\n"
            << "  planned   " << planned.value().probes << " probes to " << planned.value().vacancies
            << " vacancies (4 occupations x 3 regions)\n"
            << "  froze     the design (sha256 " << frozen.value().design_sha256.substr(0, 16)
            << "...) and the analysis plan before fieldwork\n"
            << "  simulated " << responses << " employer responses; true callback rates 27.8% (inland) vs 19.4% (coastal)\n"
            << "  imported  " << ranks.value().listings << " invented candidate rankings of Kestrel Board (invented) for the listing audit\n"
            << "  audit     " << (audit.ok() ? "chain intact, " : "CHAIN BROKEN, ") << Count(audit.entries, "entry", "entries") << "\n\n"
            << RenderTextReport(result.value()) << "\n"
            << "Study folder: " << out_dir << "\n"
            << "Reports:      " << text_path << "\n"
            << "              " << json_path << "\n"
            << "              " << html_path << "  (open it in a browser; it prints on A4)\n"
            << "Try: TWINPROBE_NOW=" << FormatIsoTime(season_end) << " twinprobe --study " << out_dir
            << " analyze   (the season's end; without it the clock says which windows are still open)\n";
  return 0;
}

}  // namespace

void RegisterDemo(CLI::App& app, Context& ctx) {
  auto out = std::make_shared<std::string>("twinprobe-demo");
  auto* demo = app.add_subcommand(
      "demo", "Run the whole pipeline on an invented study: write, plan, simulate responses, analyse, report");
  demo->add_option("--out", *out, "Folder for the demo study (replaced if it holds an earlier demo)")->capture_default_str();
  demo->callback([&ctx, out] { ctx.exit_code = RunDemo(ctx, *out); });
}

}  // namespace twinprobe
