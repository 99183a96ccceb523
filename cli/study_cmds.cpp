// Commands that set a study up: init, check (with the one-attribute proof),
// plan (with its balance report).
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <cstdio>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "analysis/balance.h"
#include "core/text.h"
#include "cli/command.h"
#include "cli/near_duplicate_output.h"
#include "core/material_files.h"
#include "core/ethics_gate.h"
#include "core/factor_signal.h"
#include "core/sha256.h"
#include "planner/carry_over.h"
#include "planner/design_words.h"
#include "planner/freeze.h"
#include "planner/materials_check.h"
#include "planner/plan_store.h"
#include "planner/study_check.h"
#include "report/design_report.h"
#include "report/p_value.h"
#include "report/plural.h"
#include "templates/embedded.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

// The files `init` writes: the example study and the ethics folder (its
// letters and README are what record, schedule and check point to).
std::vector<EmbeddedFile> InitFiles() {
  std::vector<EmbeddedFile> files = DemoStudyFiles();
  files.insert(files.end(), EthicsFiles().begin(), EthicsFiles().end());
  return files;
}

// Writes the embedded example study and the ethics folder into `dir`.
// Refuses to overwrite files: checks every path before writing any.
Status WriteExampleStudy(const std::string& dir) {
  for (const auto& f : InitFiles()) {
    fs::path p = fs::path(dir) / std::string(f.path);
    if (fs::exists(p)) return BadInput(p.string(), "already exists", "init writes only into a folder without a study; choose another --study DIR");
  }
  if (Status s = WriteExampleStudyFiles(dir); !s.ok()) return s;
  return WriteEmbeddedFiles(dir, EthicsFiles());
}

int RunInit(Context& ctx) {
  fs::create_directories(ctx.study_dir);
  Status s = WriteExampleStudy(ctx.study_dir);
  if (!s.ok()) return ReportError(s.error());
  const size_t n_files = InitFiles().size();
  if (ctx.json) {
    std::cout << nlohmann::json{{"study", ctx.study_dir}, {"files", n_files}}.dump(2) << "\n";
  } else {
    std::cout << "Created an example study in " << ctx.study_dir << " (" << n_files
              << " files: study.toml, vacancies.csv, name pools, templates, a ranks file for a listing audit, the "
                 "ethics folder).\n"
              << "It is the invented demo scenario: replace the names, templates and vacancies with your own,\n"
              << "fill in [ethics] with your board's approval (see ethics/README.md), then run '" << CommandFor(ctx, "check")
              << "' and '" << CommandFor(ctx, "plan") << "'.\n";
  }
  return 0;
}

// Prints every leak as one error line; returns the exit code for a failed check.
int ReportLeaks(const OneDifferenceReport& report) {
  for (const auto& leak : report.leaks) ReportError(leak.AsError());
  return static_cast<int>(ExitCode::kBadInput);
}

nlohmann::json LeaksJson(const OneDifferenceReport& report) {
  nlohmann::json leaks = nlohmann::json::array();
  for (const auto& l : report.leaks) {
    nlohmann::json sets = nlohmann::json::array();
    for (const auto& [vacancy, probes] : l.sets) {
      nlohmann::json ps = nlohmann::json::array();
      for (const auto& p : probes)
        ps.push_back({{"probe", p.probe}, {"arm", p.arm}, {"value", p.value ? nlohmann::json(*p.value) : nlohmann::json()}});
      sets.push_back({{"vacancy", vacancy.empty() ? nlohmann::json() : nlohmann::json(vacancy)}, {"probes", ps}});
    }
    leaks.push_back({{"field", l.field},
                     {"where", l.where},
                     {"template", l.template_path},
                     {"sets_affected", l.sets_affected},
                     {"sets", sets}});
  }
  return leaks;
}

std::string Join(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
  return s;
}

// How each factor varies, its labels, scores and signal (check --json).
nlohmann::json FactorsJson(const Design& d) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& f : d.factors) {
    nlohmann::json labels = nlohmann::json::object();
    for (const auto& l : f.levels) labels[l] = f.LevelLabel(l);
    out.push_back({{"name", f.name},
                   {"label", f.DisplayName()},
                   {"vary", d.kind == "unpaired" ? "between" : f.vary},
                   {"levels", f.levels},
                   {"level_labels", labels},
                   {"scores", f.scores.empty() ? nlohmann::json() : nlohmann::json(f.scores)},
                   {"signal", DescribeSignal(SignalOf(d, f))}});
  }
  return out;
}

// The carry-over table (planner/carry_over.h) as text: the test, then arms x
// ("first", previous arms); "-" marks a pair that cannot occur.
std::string RenderCarryOverText(const CarryOverBalance& b) {
  if (!b.present || b.pairs == 0) return "";
  std::ostringstream o;
  char statistic[80];
  std::snprintf(statistic, sizeof statistic, "X2 = %.2f, df = %d, ", b.test.statistic, b.test.df);
  const std::string line = b.test.df > 0 ? statistic + PEquals(b.test.p) : "no test: one possible pair per set group";
  o << "Carry-over (probes per arm by the arm sent just before it in the same set; chi-square test of\n"
       "equal counts over the possible pairs, where a balanced plan gives X2 near 0 and p near 1):\n"
    << "  arm x previous arm: " << line << "; largest difference between two possible pairs: " << b.max_spread
    << "\n";
  std::vector<std::string> columns{"first"};
  columns.insert(columns.end(), b.arms.begin(), b.arms.end());
  auto cell = [&](size_t i, size_t j) -> std::string {
    if (j == 0) return std::to_string(b.first[i]);
    return b.possible[i][j - 1] ? std::to_string(b.after[i][j - 1]) : "-";
  };
  size_t label_width = 0;
  for (const auto& a : b.arms) label_width = std::max(label_width, CodePoints(a));
  std::vector<size_t> widths;
  for (size_t j = 0; j < columns.size(); ++j) {
    size_t w = CodePoints(columns[j]);
    for (size_t i = 0; i < b.arms.size(); ++i) w = std::max(w, CodePoints(cell(i, j)));
    widths.push_back(w);
  }
  o << "    " << std::string(label_width, ' ');
  for (size_t j = 0; j < columns.size(); ++j) o << "  " << PadLeft(columns[j], widths[j]);
  o << "\n";
  for (size_t i = 0; i < b.arms.size(); ++i) {
    o << "    " << PadRight(b.arms[i], label_width);
    for (size_t j = 0; j < columns.size(); ++j) {
      std::string c = cell(i, j);
      o << "  " << PadLeft(c, widths[j]);
    }
    o << "\n";
  }
  return o.str();
}


nlohmann::json CarryOverJson(const CarryOverBalance& b) {
  if (!b.present) return nullptr;
  return {{"arms", b.arms},
          {"first", b.first},
          {"after", b.after},
          {"possible", b.possible},
          {"pairs", b.pairs},
          {"max_spread", b.max_spread},
          {"test", {{"method", "pearson_chi_square_goodness_of_fit"},
                    {"statistic", b.test.statistic},
                    {"df", b.test.df},
                    {"p", b.test.p}}}};
}

int RunCheck(Context& ctx) {
  auto study = CheckStudy(ctx.study_dir);
  if (!study.ok()) return ReportError(study.error());
  const auto& s = study.value();
  WarnNearDuplicates(s.near_duplicates, "vacancy", "vacancies");
  if (auto demo = DemoApprovalWarning(s.design, StudyPath(ctx, "study.toml"))) Warn(*demo);
  if (s.design.kind == "listing") {
    if (ctx.json)
      std::cout << nlohmann::json{{"ok", true}, {"study_id", s.design.study_id}, {"kind", s.design.kind},
                                  {"sources", s.design.sources.size()}}
                       .dump(2)
                << "\n";
    else
      std::cout << "Design " << s.design.study_id << " is valid: a listing audit with " << s.design.sources.size()
                << (s.design.sources.size() == 1 ? " source" : " sources")
                << " (nothing to plan; collect with 'twinprobe fetch').\n";
    return 0;
  }
  auto proof = ProveStudy(ctx.study_dir, s);
  if (!proof.ok()) return ReportError(proof.error());
  const auto& p = proof.value();
  const auto& rep = p.report;
  // The fields the templates use that a factor controls, for the summary.
  std::set<std::string> used;
  for (const auto& [path, doc] : p.templates)
    for (const auto& [field, seg] : doc.FieldUses()) used.insert(field);
  std::vector<std::string> controlled_used;
  for (const auto& f : rep.controlled_fields)
    if (used.count(f)) controlled_used.push_back(f);
  if (ctx.json) {
    std::vector<std::string> labels;
    for (const auto& a : s.design.arms) labels.push_back(a.label);
    nlohmann::json j{{"ok", rep.ok()},
                     {"study_id", s.design.study_id},
                     {"kind", s.design.kind},
                     {"arms", s.design.arms.size()},
                     {"arm_labels", labels},
                     {"reference_arm", s.design.arms[s.design.reference_arm].label},
                     {"vacancies", s.vacancies.size()},
                     {"templates", s.design.templates.size()},
                     {"profiles", p.plan.profiles.size()},
                     {"probes", p.plan.probes.size()},
                     {"sets_checked", rep.sets_checked},
                     {"renderings", rep.renderings},
                     {"controlled_fields", rep.controlled_fields},
                     {"controlled_fields_used", controlled_used},
                     {"leaks", LeaksJson(rep)},
                     {"factors", FactorsJson(s.design)},
                     {"variation", DescribeVariation(s.design)}};
    std::cout << j.dump(2) << "\n";
  }
  if (!rep.ok()) return ReportLeaks(rep);
  if (!ctx.json) {
    std::cout << "Design " << s.design.study_id << " is valid: " << s.design.kind << " design, "
              << s.design.arms.size() << " arms, " << s.vacancies.size() << " vacancies, "
              << s.design.templates.size() << " templates.\n";
    std::cout << "Factors: " << DescribeVariation(s.design) << ".\n";
    std::cout << "One-attribute proof: " << rep.sets_checked << (s.design.kind == "unpaired" ? " probes" : " sets")
              << " rendered (" << rep.renderings << " renderings compared); the probes differ only in fields a factor "
              << "controls (used by the templates: " << (controlled_used.empty() ? "none" : Join(controlled_used))
              << ").\n";
  }
  return 0;
}

int RunPlan(Context& ctx) {
  auto study = CheckStudy(ctx.study_dir);
  if (!study.ok()) return ReportError(study.error());
  const auto& s = study.value();
  WarnNearDuplicates(s.near_duplicates, "vacancy", "vacancies");
  auto proof = ProveStudy(ctx.study_dir, s);
  if (!proof.ok()) return ReportError(proof.error());
  if (!proof.value().report.ok()) return ReportLeaks(proof.value().report);
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  const std::optional<int64_t> previous_plan = CurrentPlanId(*store.value());
  auto summary = StorePlan(*store.value(), s.design, s.vacancies, proof.value().plan);
  if (!summary.ok()) return ReportError(summary.error());
  // The plan is stored; materials of the old plan would now send the wrong
  // profiles. A failed move only warns: schedule and sent refuse them anyway.
  std::optional<SupersededMove> moved;
  if (auto m = MoveSupersededMaterials(ctx.study_dir, previous_plan); m.ok())
    moved = m.value();
  else
    Warn(m.error().where + ": " + m.error().what + " — " + m.error().fix);
  if (auto frozen = ReadFreeze(*store.value()); frozen && frozen->design_sha256 != Sha256Hex(s.design.canonical))
    Warn("the design differs from the one frozen at " + frozen->at +
         "; reports will list this plan as a deviation from the pre-registration");
  const auto& sum = summary.value();
  BalanceReport balance = ComputeBalance(ReadFieldwork(*store.value(), s.design.outcomes));
  const CarryOverBalance carry_over = ComputeCarryOver(s.design, proof.value().plan);
  if (ctx.json) {
    std::cout << nlohmann::json{{"plan_id", sum.plan_id},
                                {"vacancies", sum.vacancies},
                                {"probes", sum.probes},
                                {"profiles", sum.profiles},
                                {"audit_hash", sum.audit_hash},
                                {"materials_moved", moved ? nlohmann::json{{"plan", moved->old_plan},
                                                                           {"files", moved->files},
                                                                           {"to", moved->to}}
                                                          : nlohmann::json()},
                                {"balance", BalanceJson(balance)},
                                {"carry_over", CarryOverJson(carry_over)}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Planned " << sum.probes << " probes to " << sum.vacancies << " vacancies with " << sum.profiles
              << " profiles (plan " << sum.plan_id << ", store " << StorePath(ctx) << ").\n\n";
    if (const std::string arms = DescribeArmLabels(s.design); !arms.empty()) std::cout << arms << "\n\n";
    std::cout << RenderBalanceText(balance) << RenderCarryOverText(carry_over);
    if (moved)
      std::cout << "Moved the materials of plan " << moved->old_plan << " (" << Count(moved->files, "file", "files") << ") to "
                << moved->to << ": they do not belong to plan " << sum.plan_id
                << "; run 'twinprobe render' before sending.\n";
  }
  return 0;
}

}  // namespace

void RegisterStudyCommands(CLI::App& app, Context& ctx) {
  auto dir = std::make_shared<std::string>();
  auto* init = app.add_subcommand("init", "Create an example study folder (design, vacancies, name pools, templates) to edit");
  init->add_option("dir", *dir, "The folder to create (the same as --study DIR); default: the --study folder");
  init->callback([&ctx, dir] {
    // `init DIR` reads like `git init DIR`; it names the study folder, so it
    // must not contradict a --study given as well.
    if (!dir->empty()) {
      if (ctx.study_dir != "." && ctx.study_dir != *dir) {
        ctx.exit_code = ReportError(Error{ErrorKind::kUsage, "",
                                          "init was given two study folders: --study " + ctx.study_dir + " and " + *dir,
                                          "give the folder once, either as 'init DIR' or as '--study DIR init'"});
        return;
      }
      ctx.study_dir = *dir;
    }
    ctx.exit_code = RunInit(ctx);
  });
  app.add_subcommand("check",
                     "Validate the design, vacancies, name pools and templates, and prove that the probes of every set "
                     "differ only in the tested attribute; writes nothing")
      ->callback([&ctx] { ctx.exit_code = RunCheck(ctx); });
  app.add_subcommand("plan",
                     "Assign profiles, templates, send order and send times to every vacancy, store the plan and show "
                     "its balance; refused once any probe is sent")
      ->callback([&ctx] { ctx.exit_code = RunPlan(ctx); });
}

}  // namespace twinprobe
