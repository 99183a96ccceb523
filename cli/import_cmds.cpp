// `twinprobe import`: every CSV importer under one group. The importers live
// beside the commands they belong with (responses in collect_cmds.cpp, ranked
// lists in import_ranks_cmd.cpp, listing labels in fetch_cmd.cpp); this is
// the one place that lists them, so `import --help` shows them in this order.
#include "cli/command.h"

namespace twinprobe {

void RegisterImportCommands(CLI::App& app, Context& ctx) {
  auto* import = app.add_subcommand("import", "Import data from CSV files (RFC 4180, UTF-8)");
  import->require_subcommand(1);
  AddImportResponses(*import, ctx);
  AddImportRanks(*import, ctx);
  AddImportLabels(*import, ctx);
}

}  // namespace twinprobe
