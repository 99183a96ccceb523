// Only core/ speaks SQL: the collector's recording and import side (and the
// commands that call it) hold the rules and messages, and reach the store
// through core's typed readers and writers. This test keeps it that way.
#include <catch2/catch.hpp>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace {

std::string ReadSource(const std::string& relative) {
  std::ifstream in(std::string(TWINPROBE_SOURCE_DIR) + "/" + relative, std::ios::binary);
  REQUIRE(in);
  std::stringstream text;
  text << in.rdbuf();
  return text.str();
}

}  // namespace

TEST_CASE("collector: the recording, import, history, purge and export files issue no SQL") {
  const std::vector<std::string> files = {
      "collector/import_pairs.h",    "collector/import_pairs.cpp",    "collector/import_support.h",
      "collector/import_support.cpp", "collector/import_outcomes.h",  "collector/import_outcomes.cpp",
      "collector/responses.h",       "collector/responses.cpp",       "collector/declines.h",
      "collector/declines.cpp",      "collector/history.h",           "collector/history.cpp",
      "collector/purge.h",           "collector/purge.cpp",           "collector/export.h",
      "collector/export.cpp",        "collector/event_time.h",        "collector/event_time.cpp",
      "cli/collect_cmds.cpp",        "cli/export_cmd.cpp",            "cli/history_cmd.cpp",
      "cli/ethics_cmds.cpp"};
  const std::vector<std::string> sql = {"SELECT ", "INSERT ", "UPDATE ", "DELETE ", "CREATE ", "PRAGMA ",
                                        "Prepare(", "Exec(",   "QueryInt(", "Stmt ",  "sqlite3"};
  for (const auto& file : files) {
    const std::string text = ReadSource(file);
    for (const auto& word : sql) {
      INFO(file + " contains '" + word + "'");
      CHECK(text.find(word) == std::string::npos);
    }
  }
}
