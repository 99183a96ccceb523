// Send orders balanced for carry-over (Williams 1949, "Experimental designs
// balanced for the estimation of residual effects of treatments",
// Australian Journal of Scientific Research A 2:149-168): every arm
// directly follows every other arm equally often, counted over the orders
// and over whole plans, for k = 2, 3, 4 and 5 arms per set.
#include <catch2/catch.hpp>

#include <map>
#include <set>
#include <string>

#include "planner/assign.h"
#include "planner/carry_over.h"
#include "planner/design_file.h"

using namespace twinprobe;

namespace {

// Ordered pairs (previous, next) adjacent in the rows, counted.
std::map<std::pair<int, int>, int> Follows(const std::vector<std::vector<int>>& rows) {
  std::map<std::pair<int, int>, int> follows;
  for (const auto& row : rows)
    for (size_t j = 1; j < row.size(); ++j) ++follows[{row[j - 1], row[j]}];
  return follows;
}

// A sets study of one factor with k levels (signalled by a field) and one
// name pool, `n_vacancies` vacancies of distinct employers, no strata.
struct OneFactorStudy {
  Design design;
  std::vector<Vacancy> vacancies;
  std::vector<NameList> pools;
};

OneFactorStudy MakeStudy(int k, int n_vacancies) {
  std::string levels, values, templates;
  for (int i = 0; i < k; ++i) {
    levels += (i ? ", " : "") + std::string("\"l") + std::to_string(i) + "\"";
    values += (i ? ", " : "") + std::string("\"v") + std::to_string(i) + "\"";
    templates += (i ? ", " : "") + std::string("\"t") + std::to_string(i) + ".md\"";
  }
  const std::string toml = "[study]\nid = \"orders\"\nseed = 7\nkind = \"" + std::string(k == 2 ? "paired" : "sets") +
                           "\"\n[[factor]]\nname = \"band\"\nlevels = [" + levels + "]\nfields = { band_text = [" +
                           values + "] }\n[[factor]]\nname = \"named\"\nlevels = [\"a\", \"b\"]\nvary = \"between\"\n" +
                           "[profiles]\nmailbox = \"{given}.{family}.{n}@mail.example\"\n" +
                           "[[profiles.pool]]\nfactor = \"named\"\nlevel = \"a\"\nfile = \"a.csv\"\n" +
                           "[[profiles.pool]]\nfactor = \"named\"\nlevel = \"b\"\nfile = \"b.csv\"\n" +
                           "[templates]\nfiles = [" + templates + "]\n";
  auto design = ParseDesign(toml, "study.toml", "");
  INFO(toml);
  REQUIRE(design.ok());
  OneFactorStudy s;
  s.design = design.value();
  for (int v = 0; v < n_vacancies; ++v) {
    Vacancy vac;
    vac.ref = "V" + std::to_string(v);
    vac.employer = "Employer " + std::to_string(v) + " (invented)";
    vac.line = v + 2;
    s.vacancies.push_back(vac);
  }
  for (const char* pool : {"a", "b"}) {
    NameList list;
    list.file = std::string(pool) + ".csv";
    for (int i = 0; i < k; ++i) list.names.emplace_back(std::string("Given") + pool + std::to_string(i), "Family");
    list.lines.assign(list.names.size(), 2);
    s.pools.push_back(list);
  }
  return s;
}

}  // namespace

TEST_CASE("send orders: each arm follows each other arm once (even k) or twice (odd k), k = 2 to 5") {
  for (int k = 2; k <= 5; ++k) {
    INFO("k = " << k);
    const auto rows = WilliamsOrders(k);
    const size_t expected_rows = k % 2 == 0 ? static_cast<size_t>(k) : static_cast<size_t>(2 * k);
    REQUIRE(rows.size() == expected_rows);
    const auto follows = Follows(rows);
    CHECK(follows.size() == static_cast<size_t>(k * (k - 1)));
    for (const auto& [pair, n] : follows) {
      CHECK(pair.first != pair.second);
      CHECK(n == (k % 2 == 0 ? 1 : 2));
    }
    // Every arm holds every position equally often (once per square).
    for (int pos = 0; pos < k; ++pos) {
      std::map<int, int> at;
      for (const auto& row : rows) ++at[row[static_cast<size_t>(pos)]];
      CHECK(at.size() == static_cast<size_t>(k));
      for (const auto& [arm, n] : at) CHECK(n == (k % 2 == 0 ? 1 : 2));
    }
  }
}

TEST_CASE("send orders: three arms no longer always follow each other the same way round (issue 20, item 3)") {
  // Before: the cyclic square (0 1 2, 1 2 0, 2 0 1) alone, so arm 1 followed
  // arm 0 in two rows of three and arm 0 never followed arm 1.
  const auto follows = Follows(WilliamsOrders(3));
  CHECK(follows.at({0, 1}) == 2);
  CHECK(follows.at({1, 0}) == 2);
  CHECK(follows.at({2, 1}) == 2);
}

TEST_CASE("send orders: a plan's arm x previous arm counts are equal for k = 2 to 5, counted") {
  // Two between levels of 4k(k-1)... sets each: every possible ordered pair
  // of one group is counted equally often, and the test gives X2 = 0, p = 1.
  for (int k = 2; k <= 5; ++k) {
    INFO("k = " << k);
    const int rows = k % 2 == 0 ? k : 2 * k;
    const int per_group = 2 * rows * k;  // a whole number of template x row grids and of Williams designs
    OneFactorStudy s = MakeStudy(k, 2 * per_group);
    auto plan = AssignProbes(s.design, s.vacancies, s.pools);
    REQUIRE(plan.ok());
    const CarryOverBalance b = ComputeCarryOver(s.design, plan.value());
    REQUIRE(b.present);
    const size_t A = b.arms.size();
    REQUIRE(A == static_cast<size_t>(2 * k));
    const int64_t expected = static_cast<int64_t>(per_group) * (k - 1) / (k * (k - 1));  // pairs per cell
    for (size_t a = 0; a < A; ++a)
      for (size_t p = 0; p < A; ++p) {
        INFO(b.arms[a] << " after " << b.arms[p]);
        CHECK(b.after[a][p] == (b.possible[a][p] ? expected : 0));
      }
    for (size_t a = 0; a < A; ++a) CHECK(b.first[a] == per_group / k);
    CHECK(b.pairs == static_cast<int64_t>(2 * per_group * (k - 1)));
    CHECK(b.max_spread == 0);
    CHECK(b.test.statistic == 0.0);
    CHECK(b.test.df == 2 * (k * (k - 1) - 1));
    CHECK(b.test.p == 1.0);
  }
}
