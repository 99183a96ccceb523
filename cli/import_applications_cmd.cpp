// `twinprobe import applications FILE.csv`: applicant records as a study
// (collector/import_applications.h). Registered by RegisterImportCommands
// (cli/import_cmds.cpp), which also gives it --separator.
#include <filesystem>
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "cli/near_duplicate_output.h"
#include "collector/import_applications.h"
#include "core/comma_list.h"
#include "planner/design_file.h"
#include "report/plain_summary.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

struct ApplicationsCmdOptions {
  std::string file;
  std::string strata;
  bool strata_given = false;
  std::string rejects;
  ApplicationsImportOptions import;
};

// "a, b and c"
std::string ListWords(const std::vector<std::string>& v) {
  std::string s;
  for (size_t i = 0; i < v.size(); ++i) s += (i == 0 ? "" : i + 1 == v.size() ? " and " : ", ") + v[i];
  return s;
}

std::string Quote(const std::vector<std::string>& v) {
  std::vector<std::string> q;
  for (const auto& x : v) q.push_back("'" + x + "'");
  return ListWords(q);
}

// The study folder as a command line names it, so the "Next:" line can be
// run from where the import was.
std::string StudyOption(const Context& ctx) { return " --study " + ctx.study_dir; }

nlohmann::json CovariatesJson(const std::vector<CovariateSummary>& covariates) {
  nlohmann::json out = nlohmann::json::array();
  for (const CovariateSummary& c : covariates)
    out.push_back({{"name", c.name},
                   {"kind", c.numeric ? "numeric" : "categorical"},
                   {"categories", c.numeric ? nlohmann::json(nullptr) : nlohmann::json(c.categories)}});
  return out;
}

// "years (numeric) and degree (categorical, 4 categories)"
std::string CovariateWords(const std::vector<CovariateSummary>& covariates) {
  std::vector<std::string> words;
  for (const CovariateSummary& c : covariates)
    words.push_back(c.name + (c.numeric ? " (numeric)" : " (categorical, " + Count(c.categories, "category", "categories") + ")"));
  return ListWords(words);
}

int RunImportApplications(Context& ctx, ApplicationsCmdOptions& o) {
  std::optional<Design> design;
  if (std::filesystem::exists(DesignPath(ctx.study_dir))) {
    auto d = LoadDesign(ctx.study_dir);
    if (!d.ok()) return ReportError(d.error());
    design = std::move(d).value();
  }
  PairsImportOptions& base = o.import.base;
  base.strata = SplitCommaList(o.strata);
  base.strata_given = o.strata_given;
  base.reject_path = o.rejects;
  auto r = ImportApplications(StorePath(ctx), design ? &*design : nullptr, o.file, o.import);
  if (!r.ok()) return ReportError(r.error());
  const PairsImportSummary& s = r.value();
  if (!s.ignored_columns.empty())
    Warn(std::string(s.ignored_columns.size() == 1 ? "the column " : "the columns ") + Quote(s.ignored_columns) +
         (s.ignored_columns.size() == 1 ? " is" : " are") +
         " not used; name stratum columns with --strata and the file's own names for the roles with --columns");
  WarnNearDuplicates(s.near_duplicates, "row", "rows");
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", o.file},
                                {"already_imported", s.already_imported},
                                {"new_plan", s.new_plan},
                                {"kind", s.kind},
                                {"factor", s.factor},
                                {"groups", s.arms},
                                {"reference", s.arms.empty() ? nlohmann::json(nullptr) : nlohmann::json(s.arms[0])},
                                {"positive", s.positive},
                                {"strata", s.strata},
                                {"applications_landed", s.rows_landed},
                                {"rows_rejected", s.rows_rejected},
                                {"vacancies_landed", s.vacancies_landed},
                                {"reject_file", s.reject_path.empty() ? nlohmann::json(nullptr) : nlohmann::json(s.reject_path)},
                                {"ignored_columns", s.ignored_columns},
                                {"covariates", CovariatesJson(s.covariates)}}
                     .dump(2)
              << "\n";
    return s.rows_rejected ? 1 : 0;
  }
  if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
    return 0;
  }
  std::cout << (s.new_plan ? "Created " + std::string(s.kind == "unpaired" ? "an " : "a ") + s.kind +
                                 " study of applications from "
                           : "Added to the study from ")
            << o.file << ": " << RecordsExtent(s.rows_landed, s.vacancies_landed);
  if (s.new_plan) {
    std::vector<std::string> others(s.arms.begin() + 1, s.arms.end());
    std::cout << "; " << (s.factor.empty() ? "group" : s.factor) << " " << s.arms[0] << " (reference) compared with "
              << ListWords(others) << "; a positive outcome is " << ListWords(s.positive) << "; strata "
              << (s.strata.empty() ? "none" : ListWords(s.strata));
    if (!s.covariates.empty()) std::cout << "; covariates " << CovariateWords(s.covariates);
  }
  if (s.rows_rejected)
    std::cout << "; " << Count(s.rows_rejected, "row was", "rows were") << " left out and written with the reasons to "
              << s.reject_path;
  std::cout << ".\nNext: twinprobe" << StudyOption(ctx) << " analyze\n";
  return s.rows_rejected ? 1 : 0;
}

}  // namespace

void RegisterImportApplications(CLI::App& import, Context& ctx) {
  auto o = std::make_shared<ApplicationsCmdOptions>();
  auto* cmd = import.add_subcommand(
      "applications",
      "Import applicant records, one row per application (columns vacancy,arm,outcome or your own names with "
      "--columns); creates the study when the folder has none");
  cmd->add_option("file", o->file, "CSV file")->required();
  cmd->add_option("--kind", o->import.kind,
                  "paired (two groups, one application of each per vacancy), sets (one of each group per vacancy) "
                  "or unpaired (any number per vacancy; the vacancy column is optional)")
      ->required();
  cmd->add_option("--columns", o->import.columns,
                  "The file's own column names, e.g. arm=group,outcome=invited,vacancy=req_id");
  cmd->add_option("--reference", o->import.base.reference, "The reference group (needed when the folder has no study.toml)");
  cmd->add_option("--factor", o->import.factor, "The attribute that tells the groups apart, e.g. gender (default: group)");
  cmd->add_option("--positive", o->import.positive,
                  "Outcome values that count as positive, e.g. yes,invited (default: 1, or the default response codes)");
  cmd->add_option("--stages", o->import.stages,
                  "Hiring stages in order, e.g. applied,screened,interview,offer,hire: either one yes/no column per "
                  "stage (1/0, yes/no, y/n, true/false) or an outcome column holding the furthest stage reached");
  cmd->add_option("--scores", o->import.scores,
                  "Scores of ordered groups for the trend test, e.g. a28=28,a45=45,a58=58 (every group needs one)");
  cmd->add_option("--covariates", o->import.covariates,
                  "Columns kept with each application for the adjusted odds ratio, e.g. years,degree (a column "
                  "whose every cell is a number is numeric, else categorical; empty cells are refused)");
  cmd->add_option("--strata", o->strata, "Comma-separated stratum columns, e.g. site,role")
      ->each([o](const std::string&) { o->strata_given = true; });
  cmd->add_option("--id", o->import.base.study_id, "Study id for a new study (default: the folder's name)");
  cmd->add_flag("--skip-bad", o->import.base.skip_bad,
                "Land the good rows and write every row left out, with its reason, to a reject file");
  cmd->add_option("--rejects", o->rejects, "Reject file for --skip-bad (default FILE.rejects.csv)");
  cmd->add_flag("--raw-cells", o->import.base.raw_cells,
                "Write reject file cells as they are (no \"'\" before cells beginning with = + - @)");
  cmd->callback([&ctx, o] { ctx.exit_code = RunImportApplications(ctx, *o); });
}

}  // namespace twinprobe
