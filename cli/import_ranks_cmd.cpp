// `twinprobe import ranks FILE.csv`: option parsing and printing; the
// importer is collector/import_ranks.h. Works in a folder without a design:
// the store is created when missing (only after the file checked out).
// Manual: docs/ranks.md.
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "analysis/listing_analysis.h"
#include "cli/command.h"
#include "collector/import_ranks.h"

namespace twinprobe {
namespace {

int RunImportRanks(Context& ctx, const std::string& file) {
  auto ranks = ReadRanksFile(file);
  if (!ranks.ok()) return ReportError(ranks.error());
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  auto r = ImportRanks(*store.value(), ranks.value(), TerminalProgress("import ranks"));
  if (!r.ok()) return ReportError(r.error());
  const auto& s = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", file},
                                {"already_imported", s.already_imported},
                                {"listings", s.listings},
                                {"positions", s.positions},
                                {"labels_added", s.labels_added},
                                {"strata", s.strata},
                                {"factors", s.factors}}
                     .dump(2)
              << "\n";
  } else if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::string factors;
    for (const auto& f : s.factors) factors += (factors.empty() ? "" : ", ") + f;
    std::cout << "Imported " << s.listings << " listings (" << s.positions << " positions, " << s.strata
              << " query x location strata) from " << file << "; " << s.labels_added << " item labels by "
              << factors << ".\nRun 'twinprobe analyze' for the listing audit.\n";
  }
  return 0;
}

}  // namespace

void AddImportRanks(CLI::App& import, Context& ctx) {
  auto file = std::make_shared<std::string>();
  auto* ranks = import.add_subcommand(
      "ranks",
      "Import ranked lists for a listing audit: columns listing,position,item, one column per protected "
      "attribute (e.g. gender,origin), optionally query,location,seen_by,score; all or nothing");
  ranks->add_option("file", *file, "CSV file")->required();
  ranks->callback([&ctx, file] { ctx.exit_code = RunImportRanks(ctx, *file); });
}

}  // namespace twinprobe
