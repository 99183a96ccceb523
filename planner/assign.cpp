#include "planner/assign.h"

#include <algorithm>
#include <filesystem>
#include <map>
#include <set>

#include "core/clock.h"
#include "core/csv.h"
#include "stats/random.h"

namespace twinprobe {
namespace {

std::string FillPattern(std::string pattern, const PlannedProfile& p, int n) {
  auto replace = [&](const std::string& key, const std::string& value) {
    for (size_t pos; (pos = pattern.find(key)) != std::string::npos;) pattern.replace(pos, key.size(), value);
  };
  auto slug = [](std::string s) {
    std::string out;
    for (unsigned char c : s)
      if (std::isalnum(c)) out += static_cast<char>(std::tolower(c));
    return out;
  };
  replace("{given}", slug(p.given_name));
  replace("{family}", slug(p.family_name));
  char buf[16];
  std::snprintf(buf, sizeof buf, "%03d", n);
  replace("{n}", buf);
  return pattern;
}

// The pool that names an arm: the level of the first factor.
int PoolOfArm(const Design& d, const Arm& arm) {
  const Factor& f = d.factors.front();
  const std::string& level = arm.levels.at(f.name);
  for (size_t i = 0; i < d.name_pools.size(); ++i)
    if (d.name_pools[i].factor == f.name && d.name_pools[i].level == level) return static_cast<int>(i);
  return -1;
}

// Next allowed sending moment at or after t (same clock time on a later day).
int64_t OnSendingDay(int64_t t, const std::vector<int>& weekdays) {
  for (int k = 0; k < 7; ++k) {
    if (std::find(weekdays.begin(), weekdays.end(), WeekdayOf(t)) != weekdays.end()) return t;
    t += 86400;
  }
  return t;
}

}  // namespace

Result<std::vector<NameList>> ReadNamePools(const std::string& study_dir, const Design& design) {
  std::vector<NameList> pools;
  for (const auto& np : design.name_pools) {
    std::string path = (std::filesystem::path(study_dir) / np.file).string();
    auto t = ReadCsvFile(path);
    if (!t.ok()) return t.error();
    int g = t.value().Column("given_name"), f = t.value().Column("family_name");
    if (g < 0 || f < 0)
      return BadInput(path + ":1", "a name pool needs the columns given_name and family_name", "add them");
    NameList list;
    std::set<std::string> seen;
    for (const auto& row : t.value().rows) {
      if (row.fields[g].empty() || row.fields[f].empty())
        return BadInput(path + ":" + std::to_string(row.line), "a name is empty", "fill in both parts or remove the row");
      std::string full = row.fields[g] + " " + row.fields[f];
      if (!seen.insert(full).second)
        return BadInput(path + ":" + std::to_string(row.line), "the name '" + full + "' appears twice", "remove the duplicate");
      list.names.emplace_back(row.fields[g], row.fields[f]);
    }
    if (list.names.empty()) return BadInput(path, "the name pool is empty", "add at least one name");
    pools.push_back(std::move(list));
  }
  return pools;
}

Result<Plan> AssignProbes(const Design& d, const std::vector<Vacancy>& vacancies, const std::vector<NameList>& pools) {
  stats::Rng rng(d.seed);
  Plan plan;
  const int n_arms = static_cast<int>(d.arms.size());
  const int n_templates = static_cast<int>(d.templates.size());
  const int per_set = d.kind == "unpaired" ? 1 : n_arms;

  // Profiles: one per name of each arm's pool, so a name is a stable identity.
  std::vector<std::vector<int>> arm_profiles(n_arms);
  int serial = 0;
  for (int a = 0; a < n_arms; ++a) {
    int pool = PoolOfArm(d, d.arms[a]);
    if (pool < 0) return BadInput("", "arm " + d.arms[a].label + " has no name pool", "add one to [profiles]");
    for (const auto& [given, family] : pools[pool].names) {
      PlannedProfile p;
      p.arm = a;
      p.given_name = given;
      p.family_name = family;
      ++serial;
      p.mailbox = FillPattern(d.mailbox_pattern, p, serial);
      p.phone = d.phone_pattern.empty() ? "" : FillPattern(d.phone_pattern, p, serial);
      arm_profiles[a].push_back(static_cast<int>(plan.profiles.size()));
      plan.profiles.push_back(p);
    }
  }

  // Cap per employer.
  std::map<std::string, int> per_employer;
  for (const auto& v : vacancies) {
    int& count = per_employer[v.employer];
    count += per_set;
    if (d.ethics.cap_per_employer > 0 && count > d.ethics.cap_per_employer)
      return BadInput(d.vacancies_file + ":" + std::to_string(v.line),
                      "employer '" + v.employer + "' would receive " + std::to_string(count) +
                          " probes, above the cap of " + std::to_string(d.ethics.cap_per_employer),
                      "drop a vacancy of this employer or raise [ethics].cap_per_employer with your board's consent");
  }

  // Stratum blocks: vacancies with the same stratum values, in file order.
  std::map<std::string, std::vector<int>> blocks;
  for (size_t i = 0; i < vacancies.size(); ++i) {
    std::string key;
    for (const auto& s : d.strata) key += vacancies[i].strata.at(s) + "\x1f";
    blocks[key].push_back(static_cast<int>(i));
  }

  // Rotation state per block: k-th set of a block uses template offset k, so
  // arm a gets template (k + a) mod T: each template carries each arm equally
  // often, up to one, and no two arms of a set share a template.
  std::vector<int> set_rotation(vacancies.size()), set_first(vacancies.size()), set_unpaired_arm(vacancies.size());
  for (auto& [key, members] : blocks) {
    int offset = static_cast<int>(rng.Below(static_cast<uint64_t>(std::max(1, n_templates))));
    // Balanced "who goes first": cycle through arms, shuffled within the block.
    std::vector<int> first(members.size());
    for (size_t k = 0; k < members.size(); ++k) first[k] = static_cast<int>(k % n_arms);
    rng.Shuffle(first);
    for (size_t k = 0; k < members.size(); ++k) {
      set_rotation[members[k]] = static_cast<int>((k + offset) % std::max(1, n_templates));
      set_first[members[k]] = first[k];
      set_unpaired_arm[members[k]] = first[k];
    }
  }

  int64_t start = d.schedule.start.empty() ? NowEpoch() / 86400 * 86400 : *ParseIsoTime(d.schedule.start);
  start = OnSendingDay(start + 9 * 3600, d.schedule.weekdays);
  const int sets_per_day = 20;
  std::map<std::string, std::set<int>> names_at_employer;
  std::vector<size_t> next_name(n_arms);
  for (int a = 0; a < n_arms; ++a) next_name[a] = rng.Below(arm_profiles[a].size());

  for (size_t v = 0; v < vacancies.size(); ++v) {
    // Day of the set: sets_per_day per sending day, in file order.
    int64_t day_start = start;
    for (size_t k = 0; k < v / sets_per_day; ++k) day_start = OnSendingDay(day_start + 86400, d.schedule.weekdays);
    int64_t t = day_start + static_cast<int64_t>(rng.Below(8 * 3600));
    std::vector<int> arms;
    if (d.kind == "unpaired") {
      arms.push_back(set_unpaired_arm[v]);
    } else {
      for (int a = 0; a < n_arms; ++a) arms.push_back((set_first[v] + a) % n_arms);
    }
    for (size_t k = 0; k < arms.size(); ++k) {
      int a = arms[k];
      auto& used = names_at_employer[vacancies[v].employer];
      int profile = -1;
      for (size_t tries = 0; tries < arm_profiles[a].size(); ++tries) {
        int cand = arm_profiles[a][next_name[a] % arm_profiles[a].size()];
        ++next_name[a];
        if (!used.count(cand)) {
          profile = cand;
          break;
        }
      }
      if (profile < 0)
        return BadInput(d.vacancies_file + ":" + std::to_string(vacancies[v].line),
                        "the name pool of arm " + d.arms[a].label + " is too small to avoid reusing a name at '" +
                            vacancies[v].employer + "'",
                        "add names to the pool");
      used.insert(profile);
      PlannedProbe p;
      p.vacancy = static_cast<int>(v);
      p.arm = a;
      p.profile = profile;
      p.template_index = n_templates == 0 ? 0 : (set_rotation[v] + a) % n_templates;
      p.send_order = static_cast<int>(k) + 1;
      if (k > 0) {
        int64_t gap = rng.Between(d.schedule.gap_min_hours, d.schedule.gap_max_hours) * 3600;
        t = OnSendingDay(t + gap, d.schedule.weekdays);
      }
      p.planned_at = t;
      plan.probes.push_back(p);
    }
  }
  return plan;
}

}  // namespace twinprobe
