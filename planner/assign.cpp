#include "planner/assign.h"

#include <algorithm>
#include <map>
#include <numeric>
#include <unordered_map>

#include "core/clock.h"
#include "core/pseudonym.h"
#include "planner/balanced_grid.h"
#include "planner/send_calendar.h"
#include "planner/set_groups.h"
#include "stats/random.h"

namespace twinprobe {
namespace {

std::vector<int> RandomPermutation(int n, stats::Rng& rng) {
  std::vector<int> p(n);
  std::iota(p.begin(), p.end(), 0);
  rng.Shuffle(p);
  return p;
}

// What the block randomisation decided for one vacancy.
struct SetDesign {
  int offset = 0;     // paired/sets: template offset; unpaired: arm
  int order_row = 0;  // paired/sets: row of the send-order square; unpaired: template
};

// FILE:LINE of a vacancy for messages.
std::string Where(const Design& d, const Vacancy& v) {
  return (v.file.empty() ? d.vacancies_file : v.file) + ":" + std::to_string(v.line);
}

// The place of arm `arm` among the arms of group `g`.
int WithinIndex(const std::vector<SetGroup>& groups, int g, int arm) {
  const auto& arms = groups[static_cast<size_t>(g)].arms;
  return static_cast<int>(std::find(arms.begin(), arms.end(), arm) - arms.begin());
}

}  // namespace

std::vector<std::vector<int>> SendOrderSquare(int k) {
  // Williams (1949): the sequence 0, 1, k-1, 2, k-2, … shifted by the row
  // number. For even k every ordered pair of distinct symbols is adjacent
  // exactly once; for odd k (where 0, 1, 2 is this sequence at k = 3) only
  // together with the mirror image (WilliamsOrders).
  std::vector<int> base(k);
  for (int j = 0, lo = 1, hi = k - 1; j < k; ++j) base[j] = j == 0 ? 0 : (j % 2 == 1 ? lo++ : hi--);
  std::vector<std::vector<int>> square(k, std::vector<int>(k));
  for (int r = 0; r < k; ++r)
    for (int j = 0; j < k; ++j) square[r][j] = (base[j] + r) % k;
  return square;
}

std::vector<std::vector<int>> WilliamsOrders(int k) {
  auto rows = SendOrderSquare(k);
  if (k % 2 == 1 && k >= 3)
    for (int r = 0; r < k; ++r) rows.emplace_back(rows[static_cast<size_t>(r)].rbegin(), rows[static_cast<size_t>(r)].rend());
  return rows;
}

std::string StratumBlockKey(const Design& d, const Vacancy& v) {
  std::string key;
  for (const auto& s : d.strata) key += v.strata.at(s) + "\x1f";
  return key;
}

Result<Plan> AssignProbes(const Design& d, const std::vector<Vacancy>& vacancies, const std::vector<NameList>& pools) {
  stats::Rng rng(d.seed);
  Plan plan;
  const bool unpaired = d.kind == "unpaired";
  const int n_arms = static_cast<int>(d.arms.size());
  const int n_templates = std::max<int>(1, static_cast<int>(d.templates.size()));
  // The arms a vacancy receives: one group per level of the between factors
  // (one group of every arm without them). Unpaired: one arm per vacancy.
  const std::vector<SetGroup> groups = unpaired ? std::vector<SetGroup>{} : SetGroups(d);
  const int n_groups = static_cast<int>(groups.size());
  const int per_set = unpaired ? 1 : static_cast<int>(groups.front().arms.size());

  auto profiles = BuildProfiles(d, pools);
  if (!profiles.ok()) return profiles.error();
  plan.profiles = std::move(profiles).value();
  std::vector<std::vector<int>> arm_profiles(n_arms);
  for (size_t i = 0; i < plan.profiles.size(); ++i) arm_profiles[plan.profiles[i].arm].push_back(static_cast<int>(i));

  // Employers by normalised name (the same rule as their pseudonymous key),
  // numbered once so the loops below index vectors instead of hashing names.
  std::vector<int> employer(vacancies.size());
  std::vector<int> probes_at;  // per employer
  {
    std::unordered_map<std::string, int> ids;
    ids.reserve(vacancies.size());
    for (size_t v = 0; v < vacancies.size(); ++v) {
      auto [it, fresh] = ids.emplace(NormaliseName(vacancies[v].employer), static_cast<int>(ids.size()));
      if (fresh) probes_at.push_back(0);
      employer[v] = it->second;
      int& count = probes_at[it->second];
      count += per_set;
      if (d.ethics.cap_per_employer > 0 && count > d.ethics.cap_per_employer)
        return BadInput(Where(d, vacancies[v]),
                        "employer '" + vacancies[v].employer + "' would receive " + std::to_string(count) +
                            " probes, above the cap of " + std::to_string(d.ethics.cap_per_employer),
                        "drop a vacancy of this employer or raise [ethics].cap_per_employer with your board's consent");
    }
  }

  // A name is one identity whichever arm uses it: number the distinct names.
  std::vector<int> name_of_profile(plan.profiles.size());
  {
    std::map<std::pair<std::string, std::string>, int> ids;
    for (size_t i = 0; i < plan.profiles.size(); ++i)
      name_of_profile[i] =
          ids.emplace(std::make_pair(plan.profiles[i].given_name, plan.profiles[i].family_name), static_cast<int>(ids.size()))
              .first->second;
  }

  // Stratum blocks, in sorted key order; members in file order.
  std::map<std::string, std::vector<int>> blocks;
  for (size_t v = 0; v < vacancies.size(); ++v) blocks[StratumBlockKey(d, vacancies[v])].push_back(static_cast<int>(v));

  // Global relabellings: which template is template 0 of the rotation, and
  // which within arm each symbol of the send orders stands for.
  const std::vector<int> template_of = RandomPermutation(n_templates, rng);
  const std::vector<int> arm_of_symbol = RandomPermutation(unpaired ? n_arms : per_set, rng);
  const auto orders = WilliamsOrders(unpaired ? n_arms : per_set);
  const int n_square_rows = unpaired ? n_arms : per_set;
  const bool mirrored = !unpaired && static_cast<int>(orders.size()) > n_square_rows;  // odd k: square and mirror image

  // Between factors: each stratum block's vacancies get the groups in
  // balanced numbers (blocked randomisation; extras to the groups used least
  // so far, so the plan's totals differ by at most one too).
  std::vector<int> group_of(vacancies.size(), 0);
  if (n_groups > 1) {
    BalancedGrid between(n_groups, 1);
    for (const auto& [key, members] : blocks) {
      auto cells = between.Block(static_cast<int64_t>(members.size()), rng);
      rng.Shuffle(cells);
      for (size_t j = 0; j < members.size(); ++j) group_of[members[j]] = cells[j].first;
    }
  }

  std::vector<SetDesign> set_design(vacancies.size());
  std::vector<int> orientation(vacancies.size(), 0);  // 1: the mirror-image row (odd k)
  // Odd k: per set group and square row, uses of the row and of its mirror image.
  std::vector<std::vector<int64_t>> mirror_uses(static_cast<size_t>(std::max(1, n_groups)),
                                                std::vector<int64_t>(static_cast<size_t>(n_square_rows), 0));
  auto square_uses = mirror_uses;
  BalancedGrid grid = unpaired ? BalancedGrid(n_arms, n_templates) : BalancedGrid(n_templates, n_square_rows);
  for (const auto& [key, all_members] : blocks)
    for (int g = 0; g < std::max(1, n_groups); ++g) {
      std::vector<int> members;
      for (int v : all_members)
        if (group_of[v] == g) members.push_back(v);
      auto cells = grid.Block(static_cast<int64_t>(members.size()), rng);
      rng.Shuffle(cells);
      for (size_t j = 0; j < members.size(); ++j) set_design[members[j]] = {cells[j].first, cells[j].second};
      if (!mirrored) continue;
      // Odd k: a row's uses alternate between the square and its mirror
      // image, each row starting with whichever it has used less in its
      // group. So every row is used as square and as mirror equally often,
      // up to one, over the plan: every arm follows every other arm of its
      // set equally often, and positions stay within two of each other in
      // each block and over the plan (two passes over the rows make a square
      // and its mirror, each arm in each position twice).
      const size_t gi = static_cast<size_t>(g);
      for (int v : members) {
        const size_t r = static_cast<size_t>(set_design[v].order_row);
        orientation[v] = mirror_uses[gi][r] < square_uses[gi][r] ? 1 : 0;
        ++(orientation[v] ? mirror_uses[gi][r] : square_uses[gi][r]);
      }
    }

  // Names: each arm walks its profiles in a shuffled cycle, skipping names
  // already used at the vacancy's employer.
  std::vector<size_t> next_name(n_arms);
  for (int a = 0; a < n_arms; ++a) {
    rng.Shuffle(arm_profiles[a]);
    next_name[a] = 0;
  }
  std::vector<std::vector<int>> names_at_employer(probes_at.size());  // employer -> names used there

  SendCalendar calendar(d.schedule);
  int64_t start = d.schedule.start.empty() ? NowEpoch() : *ParseIsoTime(d.schedule.start);
  int64_t day = calendar.SendingDayOnOrAfter(start);
  const int sets_per_day = std::max(1, d.schedule.sets_per_day);

  plan.probes.reserve(vacancies.size() * static_cast<size_t>(per_set));
  for (size_t v = 0; v < vacancies.size(); ++v) {
    if (v > 0 && v % static_cast<size_t>(sets_per_day) == 0) day = calendar.NextSendingDay(day);
    const SetDesign& sd = set_design[v];
    std::vector<int> arms;
    if (unpaired) arms.push_back(sd.offset);
    else {
      const auto& order = orders[static_cast<size_t>(sd.order_row + orientation[v] * n_square_rows)];
      const auto& members = groups[static_cast<size_t>(group_of[v])].arms;
      for (int pos = 0; pos < per_set; ++pos) arms.push_back(members[static_cast<size_t>(arm_of_symbol[order[pos]])]);
    }

    auto& used = names_at_employer[employer[v]];
    int64_t minute = calendar.DrawTimeOnDay(day, rng);
    for (size_t k = 0; k < arms.size(); ++k) {
      const int a = arms[k];
      int profile = -1;
      const auto& candidates = arm_profiles[a];
      for (size_t tries = 0; tries < candidates.size(); ++tries) {
        int cand = candidates[next_name[a]++ % candidates.size()];
        bool clash = std::find(used.begin(), used.end(), name_of_profile[cand]) != used.end();
        if (!clash) {
          profile = cand;
          break;
        }
      }
      if (profile < 0)
        return BadInput(Where(d, vacancies[v]),
                        "the name pool of arm " + d.arms[a].label + " is too small to avoid reusing a name at '" +
                            vacancies[v].employer + "'",
                        "add names to the pool");
      used.push_back(name_of_profile[profile]);
      if (k > 0) {
        auto next = calendar.DrawAfterGap(minute, d.schedule.gap_min_hours, d.schedule.gap_max_hours, rng);
        if (!next) return Internal("no sending time lies in the gap range; the design check should have refused it");
        minute = *next;
      }
      PlannedProbe p;
      p.vacancy = static_cast<int>(v);
      p.arm = a;
      p.profile = profile;
      // Templates rotate over the within arms (the arm's place in its group).
      p.template_index = unpaired ? template_of[sd.order_row] : template_of[(sd.offset + WithinIndex(groups, group_of[v], a)) % n_templates];
      p.send_order = static_cast<int>(k) + 1;
      p.planned_at = minute * 60;
      plan.probes.push_back(p);
    }
  }
  return plan;
}

}  // namespace twinprobe
