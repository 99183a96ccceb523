// analysis/ is pure: it computes on the plain values core's read models
// return and never touches the store, so no file of it may include the
// store's header or hold SQL.
#include <catch2/catch.hpp>

#include <filesystem>

#include "testing/testing.h"

using namespace twinprobe;

TEST_CASE("analysis purity: no file of analysis/ includes the store or holds SQL") {
  int files = 0;
  for (const auto& entry : std::filesystem::directory_iterator(testing::SourceDir() + "/analysis")) {
    const std::string name = entry.path().filename().string();
    if (!name.ends_with(".h") && !name.ends_with(".cpp")) continue;
    ++files;
    const std::string text = testing::ReadFile(entry.path().string());
    for (const char* banned : {"core/store.h", "Stmt ", ".Prepare(", "SELECT ", "sqlite3"}) {
      INFO(name << " contains " << banned);
      CHECK(text.find(banned) == std::string::npos);
    }
  }
  CHECK(files > 10);
}
