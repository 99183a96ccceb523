// Issue 17, items 9 and 10: `init` puts the ethics folder into the study
// folder, every path a message names there exists, and `check` warns when
// the demo's invented approval is kept in a study that is no longer the demo.
#include <catch2/catch.hpp>

#include <filesystem>
#include <regex>
#include <set>

#include "core/ethics_gate.h"
#include "templates/embedded.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
namespace fs = std::filesystem;

namespace {

// Every "ethics/…" file path named in the sources of the modules that print
// messages (cli, collector, planner, core).
std::set<std::string> EthicsPathsNamedInSources() {
  std::set<std::string> paths;
  const std::regex path(R"(ethics/[A-Za-z0-9_./-]*[A-Za-z0-9_-]\.md)");
  for (const char* module : {"cli", "collector", "planner", "core"})
    for (const auto& e : fs::recursive_directory_iterator(fs::path(TWINPROBE_SOURCE_DIR) / module)) {
      if (!e.is_regular_file()) continue;
      const std::string text = testing::ReadFile(e.path().string());
      for (auto it = std::sregex_iterator(text.begin(), text.end(), path); it != std::sregex_iterator(); ++it)
        paths.insert(it->str());
    }
  return paths;
}

}  // namespace

TEST_CASE("issue 17: init writes the ethics folder and every letter a message names exists there") {
  testing::TempDir dir;
  auto r = RunCli({"init", dir / "s"});
  REQUIRE(r.exit_code == 0);
  // The embedded copy is the repository's ethics folder, byte for byte.
  size_t n = 0;
  for (const auto& e : fs::recursive_directory_iterator(fs::path(TWINPROBE_SOURCE_DIR) / "ethics")) {
    if (!e.is_regular_file()) continue;
    ++n;
    std::string rel = fs::relative(e.path(), TWINPROBE_SOURCE_DIR).generic_string();
    INFO(rel);
    CHECK(testing::ReadFile(dir / ("s/" + rel)) == testing::ReadFile(e.path().string()));
  }
  CHECK(n == EthicsFiles().size());
  const std::set<std::string> named = EthicsPathsNamedInSources();
  CHECK(named.count("ethics/letters/decline-invitation.md") == 1);
  CHECK(named.count("ethics/README.md") == 1);
  for (const auto& p : named) {
    INFO(p);
    CHECK(fs::is_regular_file(dir / ("s/" + p)));
  }
}

TEST_CASE("issue 17: init refuses a folder that already has the ethics folder and writes nothing") {
  testing::TempDir dir;
  testing::WriteFile(dir / "s/ethics/README.md", "ours\n");
  auto r = RunCli({"init", dir / "s"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + (dir / "s/ethics/README.md") +
                     ": already exists \u2014 init writes only into a folder without a study; choose another --study "
                     "DIR\n");
  CHECK_FALSE(fs::exists(dir / "s/study.toml"));
  CHECK(testing::ReadFile(dir / "s/ethics/README.md") == "ours\n");
}

TEST_CASE("issue 17: check warns when a study that is not the demo keeps the demo's approval") {
  testing::TempDir dir;
  REQUIRE(RunCli({"init", dir / "s"}).exit_code == 0);
  auto demo = RunCli({"--study", dir / "s", "check"});
  CHECK(demo.exit_code == 0);
  CHECK(demo.err.empty());
  std::string toml = testing::ReadFile(dir / "s/study.toml");
  const std::string id = "id = \"veldmark-callbacks-demo\"";
  REQUIRE(toml.find(id) != std::string::npos);
  // The demo's constants are the embedded demo's own.
  CHECK(toml.find(std::string("id = \"") + kDemoStudyId + "\"") != std::string::npos);
  CHECK(toml.find(std::string("approval = \"") + kDemoApprovalReference + " ") != std::string::npos);
  testing::WriteFile(dir / "s/study.toml", toml.replace(toml.find(id), id.size(), "id = \"harbour-callbacks\""));
  auto r = RunCli({"--study", dir / "s", "check"});
  CHECK(r.exit_code == 0);
  CHECK(r.err == "twinprobe: warning: " + (dir / "s/study.toml") +
                     ": [ethics].approval is the demo's invented reference VREB-2027-014 in study 'harbour-callbacks' "
                     "\u2014 enter the reference of your own ethics review board's approval (see ethics/README.md)\n");
}
