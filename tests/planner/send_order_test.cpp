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
#include "planner/set_groups.h"
#include "stats/random.h"

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

OneFactorStudy MakeStudy(int k, int n_vacancies, int n_between = 2, int n_zones = 0, uint64_t seed = 7) {
  std::string levels, values, templates;
  for (int i = 0; i < k; ++i) {
    levels += (i ? ", " : "") + std::string("\"l") + std::to_string(i) + "\"";
    values += (i ? ", " : "") + std::string("\"v") + std::to_string(i) + "\"";
    templates += (i ? ", " : "") + std::string("\"t") + std::to_string(i) + ".md\"";
  }
  std::string named_levels, pools;
  for (int i = 0; i < n_between; ++i) {
    const std::string l(1, static_cast<char>('a' + i));
    named_levels += (i ? ", \"" : "\"") + l + "\"";
    pools += "[[profiles.pool]]\nfactor = \"named\"\nlevel = \"" + l + "\"\nfile = \"" + l + ".csv\"\n";
  }
  const std::string toml = "[study]\nid = \"orders\"\nseed = " + std::to_string(seed) + "\nkind = \"" +
                           std::string(k == 2 ? "paired" : "sets") + "\"\n[[factor]]\nname = \"band\"\nlevels = [" +
                           levels + "]\nfields = { band_text = [" + values +
                           "] }\n[[factor]]\nname = \"named\"\nlevels = [" + named_levels + "]\nvary = \"between\"\n" +
                           "[profiles]\nmailbox = \"{given}.{family}.{n}@mail.example\"\n" + pools +
                           "[templates]\nfiles = [" + templates + "]\n" +
                           (n_zones > 0 ? "[strata]\ncolumns = [\"zone\"]\n" : "");
  auto design = ParseDesign(toml, "study.toml", "");
  INFO(toml);
  REQUIRE(design.ok());
  OneFactorStudy s;
  s.design = design.value();
  stats::Rng rng(seed);
  for (int v = 0; v < n_vacancies; ++v) {
    Vacancy vac;
    if (n_zones > 0) vac.strata["zone"] = "z" + std::to_string(rng.Below(static_cast<uint64_t>(n_zones)));
    vac.ref = "V" + std::to_string(v);
    vac.employer = "Employer " + std::to_string(v) + " (invented)";
    vac.line = v + 2;
    s.vacancies.push_back(vac);
  }
  for (int i = 0; i < n_between; ++i) {
    const std::string pool(1, static_cast<char>('a' + i));
    NameList list;
    list.file = pool + ".csv";
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

TEST_CASE("send orders: between levels, positions and templates stay balanced over random blocks and seeds") {
  for (uint64_t seed = 1; seed <= 60; ++seed) {
    const int k = 2 + static_cast<int>(seed % 4), n_between = 2 + static_cast<int>(seed % 2);
    const int n_vacancies = 5 + static_cast<int>((seed * 37) % 90), n_zones = 1 + static_cast<int>(seed % 3);
    INFO("seed " << seed << ", k = " << k << ", " << n_between << " between levels, " << n_vacancies << " vacancies");
    OneFactorStudy s = MakeStudy(k, n_vacancies, n_between, n_zones, seed);
    auto plan = AssignProbes(s.design, s.vacancies, s.pools);
    REQUIRE(plan.ok());
    const auto groups = SetGroups(s.design);
    std::map<int, std::vector<const PlannedProbe*>> sets;
    for (const auto& p : plan.value().probes) sets[p.vacancy].push_back(&p);
    REQUIRE(sets.size() == static_cast<size_t>(n_vacancies));
    std::map<std::string, std::map<size_t, int>> group_per_zone;
    std::map<std::string, std::map<std::pair<int, int>, int>> arm_position;  // zone|group -> (within arm, position)
    for (const auto& [v, probes] : sets) {
      REQUIRE(probes.size() == static_cast<size_t>(k));
      // The set is exactly one group's arms, each once, with distinct templates.
      size_t g = 0;
      while (g < groups.size() &&
             std::find(groups[g].arms.begin(), groups[g].arms.end(), probes.front()->arm) == groups[g].arms.end())
        ++g;
      REQUIRE(g < groups.size());
      std::set<int> arms, templates;
      for (size_t pos = 0; pos < probes.size(); ++pos) {
        const auto& members = groups[g].arms;
        auto at = std::find(members.begin(), members.end(), probes[pos]->arm);
        REQUIRE(at != members.end());
        arms.insert(probes[pos]->arm);
        templates.insert(probes[pos]->template_index);
        ++arm_position[s.vacancies[static_cast<size_t>(v)].strata.at("zone") + "|" + std::to_string(g)]
                      [{static_cast<int>(at - members.begin()), static_cast<int>(pos)}];
      }
      CHECK(arms.size() == static_cast<size_t>(k));
      CHECK(templates.size() == static_cast<size_t>(k));
      ++group_per_zone[s.vacancies[static_cast<size_t>(v)].strata.at("zone")][g];
    }
    // Between levels: within one per zone.
    for (auto& [zone, counts] : group_per_zone) {
      int lo = 1 << 30, hi = 0;
      for (size_t g = 0; g < groups.size(); ++g) lo = std::min(lo, counts[g]), hi = std::max(hi, counts[g]);
      CHECK(hi - lo <= 1);
    }
    // Positions: within one per zone and between level (two for odd k, whose
    // orders come from a square and its mirror image).
    for (auto& [block, cells] : arm_position) {
      int lo = 1 << 30, hi = 0;
      for (int a = 0; a < k; ++a)
        for (int pos = 0; pos < k; ++pos) lo = std::min(lo, cells[{a, pos}]), hi = std::max(hi, cells[{a, pos}]);
      INFO("block " << block);
      CHECK(hi - lo <= (k % 2 == 1 ? 2 : 1));
    }
  }
}
