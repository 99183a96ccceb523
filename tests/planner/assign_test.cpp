// Property tests of the assignment over many seeds and random designs
// (tests/planner/random_study.h), plus a few fixed cases.
#include <catch2/catch.hpp>

#include <algorithm>
#include <map>
#include <set>
#include <sstream>

#include "core/clock.h"
#include "core/pseudonym.h"
#include "planner/assign.h"
#include "planner/random_study.h"

using namespace twinprobe;

namespace {

constexpr int kRandomDesigns = 400;  // each with its own seed

// max - min of the values in a map's second members (0 when empty).
template <typename Map>
int64_t Spread(const Map& m) {
  if (m.empty()) return 0;
  auto [lo, hi] = std::minmax_element(m.begin(), m.end(), [](const auto& a, const auto& b) { return a.second < b.second; });
  return hi->second - lo->second;
}

std::string PlanText(const Plan& plan) {
  std::ostringstream o;
  for (const auto& p : plan.profiles) {
    o << p.arm << "|" << p.full_name() << "|" << p.mailbox << "|" << p.phone;
    for (const auto& [k, v] : p.fields) o << "|" << k << "=" << v;
    o << "\n";
  }
  for (const auto& p : plan.probes)
    o << p.vacancy << " " << p.arm << " " << p.profile << " " << p.template_index << " " << p.send_order << " "
      << p.planned_at << "\n";
  return o.str();
}

// Checks every promise of planner/assign.h; returns "" or what failed.
std::string Violation(const testing::RandomStudy& s, const Plan& plan) {
  const Design& d = s.design;
  const bool unpaired = d.kind == "unpaired";
  const int A = static_cast<int>(d.arms.size()), T = static_cast<int>(d.templates.size());
  std::ostringstream why;

  // Group probes by set (they come grouped, vacancies in file order).
  std::vector<std::vector<const PlannedProbe*>> sets(s.vacancies.size());
  for (const auto& p : plan.probes) sets[p.vacancy].push_back(&p);
  std::map<std::string, std::vector<int>> blocks;
  for (size_t v = 0; v < s.vacancies.size(); ++v) blocks[StratumBlockKey(d, s.vacancies[v])].push_back(static_cast<int>(v));

  std::map<std::pair<int, int>, int64_t> global_arm_template, global_arm_position;
  std::map<int, int64_t> global_arm, global_template;
  for (int a = 0; a < A; ++a) {
    global_arm[a] = 0;
    for (int t = 0; t < T; ++t) global_arm_template[{a, t}] = 0;
    for (int k = 0; k < A; ++k) global_arm_position[{a, k}] = 0;
  }
  for (int t = 0; t < T; ++t) global_template[t] = 0;

  for (const auto& [key, members] : blocks) {
    std::map<std::pair<int, int>, int64_t> arm_template, arm_position;
    std::map<int, int64_t> arm_count, template_count;
    for (int a = 0; a < A; ++a) {
      arm_count[a] = 0;
      for (int t = 0; t < T; ++t) arm_template[{a, t}] = 0;
      for (int k = 0; k < A; ++k) arm_position[{a, k}] = 0;
    }
    for (int t = 0; t < T; ++t) template_count[t] = 0;
    for (int v : members) {
      const auto& set = sets[v];
      size_t expected = unpaired ? 1 : static_cast<size_t>(A);
      if (set.size() != expected) return "set of vacancy " + std::to_string(v) + " has " + std::to_string(set.size()) + " probes";
      std::set<int> arms_in_set, templates_in_set;
      for (size_t k = 0; k < set.size(); ++k) {
        const PlannedProbe& p = *set[k];
        if (p.send_order != static_cast<int>(k) + 1) return "send order out of sequence";
        arms_in_set.insert(p.arm);
        templates_in_set.insert(p.template_index);
        ++arm_template[{p.arm, p.template_index}];
        ++arm_position[{p.arm, static_cast<int>(k)}];
        ++arm_count[p.arm];
        ++template_count[p.template_index];
        ++global_arm_template[{p.arm, p.template_index}];
        ++global_arm_position[{p.arm, static_cast<int>(k)}];
        ++global_arm[p.arm];
        ++global_template[p.template_index];
        if (plan.profiles[p.profile].arm != p.arm) return "probe sent with a profile of another arm";
      }
      if (arms_in_set.size() != set.size()) return "an arm appears twice in a set";
      if (templates_in_set.size() != set.size()) return "two probes of a set share a template";
    }
    if (unpaired) {
      if (Spread(arm_count) > 1) return "block arm counts differ by more than one";
      if (Spread(template_count) > 1) return "block template counts differ by more than one";
      if (Spread(arm_template) > 1) return "block arm x template cells differ by more than one";
    } else {
      if (Spread(arm_template) > 1) return "block arm x template cells differ by more than one";
      const int64_t block_slack = A % 2 == 1 && A >= 3 ? 2 : 1;  // odd: square and mirror (planner/assign.h)
      if (Spread(arm_position) > block_slack)
        return "block arm x send position cells differ by more than " + std::to_string(block_slack);
    }
  }
  if (unpaired) {
    if (Spread(global_arm) > 1) return "plan arm counts differ by more than one";
    if (Spread(global_template) > 1) return "plan template counts differ by more than one";
  } else {
    if (Spread(global_arm_template) > 1) return "plan arm x template cells differ by more than one";
    // For an odd number of arms the send orders are a Williams square and its
    // mirror image, each row used as both equally often up to one, so a
    // position cell is within two of the others (planner/assign.h).
    const int64_t position_slack = A % 2 == 1 && A >= 3 ? 2 : 1;
    if (Spread(global_arm_position) > position_slack)
      return "plan arm x send position cells differ by more than " + std::to_string(position_slack);
  }

  // Names and the cap per employer.
  std::map<std::string, std::set<std::string>> names_at;
  std::map<std::string, int> probes_at;
  for (const auto& p : plan.probes) {
    std::string employer = NormaliseName(s.vacancies[p.vacancy].employer);
    if (!names_at[employer].insert(plan.profiles[p.profile].full_name()).second) return "a name is reused at an employer";
    if (++probes_at[employer] > d.ethics.cap_per_employer) return "the cap per employer is exceeded";
  }

  // Times: inside the sending windows; gaps inside the declared range; the
  // first probe of the v-th set on the (v / sets_per_day)-th sending day.
  std::vector<int64_t> first_days;
  for (size_t v = 0; v < sets.size(); ++v) {
    const auto& set = sets[v];
    for (size_t k = 0; k < set.size(); ++k) {
      int64_t t = set[k]->planned_at;
      if (t % 60 != 0) return "a planned time is not a whole minute";
      int hour = static_cast<int>(t % 86400 / 3600);
      if (std::find(d.schedule.weekdays.begin(), d.schedule.weekdays.end(), WeekdayOf(t)) == d.schedule.weekdays.end())
        return "a probe is planned on a day without sending";
      if (hour < d.schedule.hour_open || hour >= d.schedule.hour_close) return "a probe is planned outside sending hours";
      if (k > 0) {
        int64_t gap = t - set[k - 1]->planned_at;
        if (gap < int64_t{d.schedule.gap_min_hours} * 3600 || gap > int64_t{d.schedule.gap_max_hours} * 3600)
          return "a gap of " + std::to_string(gap) + " s is outside the declared range";
      }
    }
    int64_t day = set.front()->planned_at / 86400 * 86400;
    if (v % d.schedule.sets_per_day == 0) first_days.push_back(day);
    else if (day != first_days.back()) return "a set starts on the wrong day";
  }
  for (size_t i = 1; i < first_days.size(); ++i)
    if (first_days[i] <= first_days[i - 1]) return "sending days do not advance";
  if (!first_days.empty() && first_days.front() < *ParseIsoTime(d.schedule.start)) return "sending starts before [schedule].start";
  return why.str();
}

}  // namespace

TEST_CASE("assign: every balance property holds over random designs and seeds") {
  std::map<std::string, int> kinds;
  for (uint64_t seed = 1; seed <= kRandomDesigns; ++seed) {
    auto s = testing::MakeRandomStudy(seed);
    ++kinds[s.design.kind];
    auto plan = AssignProbes(s.design, s.vacancies, s.pools);
    INFO("seed " << seed << "\n" << s.toml);
    REQUIRE(plan.ok());
    CHECK(Violation(s, plan.value()) == "");
  }
  // The generator reaches every kind.
  CHECK(kinds["paired"] > 50);
  CHECK(kinds["sets"] > 50);
  CHECK(kinds["unpaired"] > 50);
}

TEST_CASE("assign: the same seed gives the same plan byte for byte, another seed another plan") {
  for (uint64_t seed = 1; seed <= 60; ++seed) {
    auto s = testing::MakeRandomStudy(seed);
    INFO("seed " << seed);
    auto a = AssignProbes(s.design, s.vacancies, s.pools);
    auto b = AssignProbes(s.design, s.vacancies, s.pools);
    REQUIRE(a.ok());
    REQUIRE(b.ok());
    CHECK(PlanText(a.value()) == PlanText(b.value()));
    if (s.vacancies.size() >= 20) {
      Design other = s.design;
      other.seed += 1;
      auto c = AssignProbes(other, s.vacancies, s.pools);
      REQUIRE(c.ok());
      CHECK(PlanText(a.value()) != PlanText(c.value()));
    }
  }
}

TEST_CASE("assign: each kind over many seeds, larger blocks") {
  for (const char* kind : {"paired", "sets", "unpaired"})
    for (uint64_t seed = 1000; seed < 1040; ++seed) {
      auto s = testing::MakeRandomStudy(seed, kind);
      INFO(kind << " seed " << seed << "\n" << s.toml);
      auto plan = AssignProbes(s.design, s.vacancies, s.pools);
      REQUIRE(plan.ok());
      CHECK(Violation(s, plan.value()) == "");
    }
}

TEST_CASE("assign: a cap per employer below what the vacancies need is refused with the vacancy's line") {
  auto s = testing::MakeRandomStudy(7, "paired");
  // Two vacancies of one employer need 4 probes; a cap of 3 is too low.
  s.vacancies.resize(2);
  s.vacancies[1].employer = s.vacancies[0].employer;
  s.design.ethics.cap_per_employer = 3;
  auto plan = AssignProbes(s.design, s.vacancies, s.pools);
  REQUIRE_FALSE(plan.ok());
  CHECK(plan.error().where == s.design.vacancies_file + ":3");
  CHECK(plan.error().what == "employer '" + s.vacancies[0].employer + "' would receive 4 probes, above the cap of 3");
}

TEST_CASE("assign: a pool too small to avoid reusing a name at an employer is refused") {
  auto s = testing::MakeRandomStudy(11, "paired");
  s.design.ethics.cap_per_employer = 0;
  s.vacancies.resize(3);
  for (auto& v : s.vacancies) v.employer = "Same Employer (invented)";
  for (auto& pool : s.pools) {
    pool.names.resize(2);
    pool.extra.resize(2);
    pool.lines.resize(2);
  }
  auto plan = AssignProbes(s.design, s.vacancies, s.pools);
  REQUIRE_FALSE(plan.ok());
  CHECK(plan.error().where == s.design.vacancies_file + ":4");
  CHECK(plan.error().what.find("is too small to avoid reusing a name at 'Same Employer (invented)'") != std::string::npos);
}

TEST_CASE("assign: the send-order square is Latin, and Williams-balanced for an even number of arms") {
  for (int k = 1; k <= 8; ++k) {
    auto sq = SendOrderSquare(k);
    REQUIRE(sq.size() == static_cast<size_t>(k));
    for (int i = 0; i < k; ++i) {
      std::set<int> row(sq[i].begin(), sq[i].end()), col;
      for (int r = 0; r < k; ++r) col.insert(sq[r][i]);
      CHECK(row.size() == static_cast<size_t>(k));
      CHECK(col.size() == static_cast<size_t>(k));
    }
    if (k % 2 == 0) {
      std::map<std::pair<int, int>, int> follows;
      for (const auto& row : sq)
        for (int j = 1; j < k; ++j) ++follows[{row[j - 1], row[j]}];
      CHECK(follows.size() == static_cast<size_t>(k * (k - 1)));
      for (const auto& [pair, n] : follows) CHECK(n == 1);
    }
  }
}
