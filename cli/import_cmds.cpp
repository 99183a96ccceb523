// `twinprobe import`: every CSV importer under one group. The importers live
// beside the commands they belong with (responses in collect_cmds.cpp, ranked
// lists in import_ranks_cmd.cpp, listing labels in fetch_cmd.cpp); this is
// the one place that lists them, so `import --help` shows them in this order,
// and the one place that gives each of them `--separator`.
#include "cli/command.h"
#include "core/csv.h"

namespace twinprobe {

void RegisterImportCommands(CLI::App& app, Context& ctx) {
  auto* import = app.add_subcommand("import", "Import data from CSV files (RFC 4180, UTF-8)");
  import->require_subcommand(1);
  // Every importer offers --separator, so a refused ';'- or tab-separated
  // header can name it as the fix.
  import->preparse_callback([](std::size_t) { SetCsvDialect({',', true}); });
  AddImportResponses(*import, ctx);
  RegisterImportSendings(*import, ctx);
  RegisterImportApplications(*import, ctx);
  AddImportRanks(*import, ctx);
  AddImportLabels(*import, ctx);
  for (CLI::App* importer : import->get_subcommands({}))
    importer
        ->add_option_function<std::string>(
            "--separator",
            [](const std::string& value) {
              // The check below has let only known spellings through.
              SetCsvDialect({ParseCsvSeparator(value).value_or(','), true});
            },
            "Field separator of the file: ',' (the default), ';', '|' or tab (spreadsheets in locales with a "
            "decimal comma save ';')")
        ->check(CLI::Validator(
            [](std::string& value) -> std::string {
              return ParseCsvSeparator(value) ? "" : "give ',', ';', '|' or tab, not '" + value + "'";
            },
            "SEP"));
}

}  // namespace twinprobe
