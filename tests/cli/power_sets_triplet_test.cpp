// Issue 20: `power` for a triplet design counted a pair of probes per
// vacancy (223 vacancies, 446 applications). `power sets` counts one probe
// of each of the three arms per vacancy: 223 vacancies are 669 applications.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using twinprobe::testing::RunCli;

TEST_CASE("issue 20: power sets counts three applications per vacancy of a triplet design") {
  auto text = RunCli({"power", "sets", "--rates", "0.12,0.10,0.07", "--vacancies", "223"});
  INFO(text.err);
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("\nWith 223 vacancies (669 applications):\n") != std::string::npos);
  auto json = RunCli({"--json", "power", "sets", "--rates", "0.12,0.10,0.07", "--vacancies", "223"});
  REQUIRE(json.exit_code == 0);
  const auto j = nlohmann::json::parse(json.out);
  CHECK(j["design"] == "sets");
  CHECK(j["arms"] == 3);
  CHECK(j["vacancies"] == 223);
  CHECK(j["applications"] == 669);
}
