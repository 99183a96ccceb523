#pragma once
// Random but valid studies for the planner's property tests: a design file
// (as TOML text, parsed by the real parser), vacancies and name pools in
// memory. Everything is drawn from one seed, so a failing case can be
// replayed from the seed the test prints.
#include <algorithm>
#include <map>
#include <set>
#include <string>
#include <vector>

#include "core/design.h"
#include "planner/design_file.h"
#include "planner/name_pools.h"
#include "planner/vacancies.h"
#include "stats/random.h"

namespace twinprobe::testing {

struct RandomStudy {
  std::string toml;
  Design design;
  std::vector<Vacancy> vacancies;
  std::vector<NameList> pools;
};

inline std::string Quote(const std::string& s) { return "\"" + s + "\""; }

// `kind` "" draws one of paired, sets, unpaired.
inline RandomStudy MakeRandomStudy(uint64_t seed, std::string kind = "") {
  stats::Rng rng(seed * 7919 + 17);
  auto pick = [&](int lo, int hi) { return static_cast<int>(rng.Between(lo, hi)); };
  for (int attempt = 0;; ++attempt) {
    RandomStudy s;
    std::string k = kind.empty() ? std::vector<std::string>{"paired", "sets", "unpaired"}[pick(0, 2)] : kind;
    int n_factors = pick(1, 3);
    struct F {
      std::string name;
      std::vector<std::string> levels;
      int reference = 0;
      bool named = false;
    };
    std::vector<F> factors;
    for (int f = 0; f < n_factors; ++f) {
      F x;
      x.name = "factor" + std::to_string(f);
      int n_levels = pick(2, 3);
      for (int l = 0; l < n_levels; ++l) x.levels.push_back("lv" + std::to_string(f) + std::to_string(l));
      x.reference = pick(0, n_levels - 1);
      factors.push_back(x);
    }
    // Names signal a non-empty subset of the factors; the others set fields.
    factors[pick(0, n_factors - 1)].named = true;
    for (auto& f : factors) f.named = f.named || rng.Bernoulli(0.3);

    std::string t = "[study]\nid = \"random\"\nseed = " + std::to_string(rng.Below(1u << 30)) + "\nkind = " + Quote(k) + "\n\n";
    for (const auto& f : factors) {
      t += "[[factor]]\nname = " + Quote(f.name) + "\nlevels = [";
      for (size_t l = 0; l < f.levels.size(); ++l) t += (l ? ", " : "") + Quote(f.levels[l]);
      t += "]\nreference = " + Quote(f.levels[f.reference]) + "\n";
      if (!f.named || rng.Bernoulli(0.3)) {
        t += "fields = { " + f.name + "_text = [";
        for (size_t l = 0; l < f.levels.size(); ++l) t += (l ? ", " : "") + Quote("value of " + f.levels[l]);
        t += "] }\n";
      }
      t += "\n";
    }
    // Arms: all, neighbours, or a list holding the reference.
    std::vector<std::map<std::string, std::string>> all{{}};
    for (const auto& f : factors) {
      std::vector<std::map<std::string, std::string>> next;
      for (const auto& c : all)
        for (const auto& l : f.levels) {
          auto e = c;
          e[f.name] = l;
          next.push_back(e);
        }
      all = next;
    }
    std::map<std::string, std::string> reference;
    for (const auto& f : factors) reference[f.name] = f.levels[f.reference];
    std::vector<std::map<std::string, std::string>> arms;
    std::string arms_toml;
    int mode = k == "paired" ? 2 : pick(0, 2);
    if (mode == 0 && all.size() <= 8) {
      arms = all;
      arms_toml = "include = \"all\"";
    } else if (mode == 1 || (mode == 0 && all.size() > 8)) {
      for (const auto& c : all) {
        int changed = 0;
        for (const auto& f : factors) changed += c.at(f.name) != f.levels[f.reference];
        if (changed <= 1) arms.push_back(c);
      }
      arms_toml = "include = \"neighbours\"";
    } else {
      arms.push_back(reference);
      int extra = k == "paired" ? 1 : pick(1, std::min<int>(5, static_cast<int>(all.size()) - 1));
      std::vector<std::map<std::string, std::string>> others;
      for (const auto& c : all)
        if (c != reference) others.push_back(c);
      rng.Shuffle(others);
      for (int i = 0; i < extra; ++i) arms.push_back(others[i]);
      rng.Shuffle(arms);
      arms_toml = "list = [";
      for (size_t a = 0; a < arms.size(); ++a) {
        arms_toml += a ? ", {" : "{";
        bool first = true;
        for (const auto& [f, l] : arms[a]) arms_toml += (first ? "" : ", ") + f + " = " + Quote(l), first = false;
        arms_toml += "}";
      }
      arms_toml += "]";
    }
    t += "[arms]\n" + arms_toml + "\n\n";
    const int n_arms = static_cast<int>(arms.size());

    // Pools: one per combination of name-factor levels the arms use.
    std::vector<std::string> name_factors;
    for (const auto& f : factors)
      if (f.named) name_factors.push_back(f.name);
    std::map<std::map<std::string, std::string>, int> pool_users;  // key -> arms using it
    for (const auto& a : arms) {
      std::map<std::string, std::string> key;
      for (const auto& f : name_factors) key[f] = a.at(f);
      ++pool_users[key];
    }
    t += "[profiles]\nmailbox = \"{given}.{family}.{n}@mail.example\"\nphone = \"+00 555 {n}\"\n";
    std::vector<std::map<std::string, std::string>> pool_keys;
    for (const auto& [key, users] : pool_users) {
      t += "[[profiles.pool]]\nlevels = { ";
      bool first = true;
      for (const auto& [f, l] : key) t += (first ? "" : ", ") + f + " = " + Quote(l), first = false;
      t += " }\nfile = \"names/pool" + std::to_string(pool_keys.size()) + ".csv\"\n";
      pool_keys.push_back(key);
    }
    int n_templates = k == "unpaired" ? pick(1, 4) : n_arms + pick(0, 3);
    t += "\n[templates]\nfiles = [";
    for (int i = 0; i < n_templates; ++i) t += (i ? ", " : "") + Quote("templates/t" + std::to_string(i) + ".md");
    t += "]\n\n";

    // Sending days and hours, gaps (a range that cannot be kept is retried).
    std::vector<std::string> days = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};
    rng.Shuffle(days);
    int n_days = pick(1, 7);
    int open = pick(0, 20), close = pick(open + 1, 24);
    int gap_min = pick(0, 72), gap_max = gap_min + pick(0, 200);
    t += "[schedule]\nstart = \"2027-03-0" + std::to_string(pick(1, 9)) + "\"\ngap_hours = [" + std::to_string(gap_min) + ", " +
         std::to_string(gap_max) + "]\nweekdays = [";
    for (int i = 0; i < n_days; ++i) t += (i ? ", " : "") + Quote(days[i]);
    t += "]\nhours = [" + std::to_string(open) + ", " + std::to_string(close) + "]\nsets_per_day = " +
         std::to_string(pick(1, 30)) + "\n\n";

    // Strata and vacancies; employers repeat.
    int n_strata = pick(0, 2);
    std::vector<std::vector<std::string>> stratum_values(n_strata);
    if (n_strata) {
      t += "[strata]\ncolumns = [";
      for (int i = 0; i < n_strata; ++i) {
        t += (i ? ", " : "") + Quote("stratum" + std::to_string(i));
        for (int v = pick(1, 4); v > 0; --v) stratum_values[i].push_back("s" + std::to_string(i) + "v" + std::to_string(v));
      }
      t += "]\n\n";
    }
    int n_vacancies = pick(1, 250);
    int n_employers = pick(std::max(1, n_vacancies / 4), n_vacancies);
    std::map<std::string, int> sets_at;
    for (int v = 0; v < n_vacancies; ++v) {
      Vacancy vac;
      char ref[16];
      std::snprintf(ref, sizeof ref, "V%04d", v + 1);
      vac.ref = ref;
      vac.employer = "Employer " + std::to_string(rng.Below(static_cast<uint64_t>(n_employers))) + " (invented)";
      vac.line = v + 2;
      vac.fields["vacancy"] = vac.ref;
      vac.fields["employer"] = vac.employer;
      for (int i = 0; i < n_strata; ++i) {
        const auto& vals = stratum_values[i];
        std::string value = vals[rng.Below(vals.size())];
        vac.strata["stratum" + std::to_string(i)] = value;
        vac.fields["stratum" + std::to_string(i)] = value;
      }
      ++sets_at[vac.employer];
      s.vacancies.push_back(vac);
    }
    int max_sets = 0;
    for (const auto& [e, n] : sets_at) max_sets = std::max(max_sets, n);
    int per_set = k == "unpaired" ? 1 : n_arms;
    t += "[ethics]\ncap_per_employer = " + std::to_string(max_sets * per_set) + "\n";

    auto design = ParseDesign(t, "study.toml", "");
    if (!design.ok()) {
      if (design.error().what.find("cannot be kept") != std::string::npos && attempt < 50) continue;
      throw std::runtime_error("random design does not parse: " + design.error().Message() + "\n" + t);
    }
    s.toml = t;
    s.design = design.value();
    // Pools large enough that no employer needs a name twice: each arm using
    // the pool may send max_sets probes there.
    for (size_t p = 0; p < pool_keys.size(); ++p) {
      NameList list;
      list.file = "names/pool" + std::to_string(p) + ".csv";
      list.path = list.file;
      int users = pool_users[pool_keys[p]];
      int size = users * max_sets + pick(0, 6);
      for (int i = 0; i < size; ++i) {
        list.names.emplace_back("Given" + std::to_string(p) + "x" + std::to_string(i), "Family" + std::to_string(i % 7));
        list.extra.emplace_back();
        list.lines.push_back(i + 2);
      }
      // Pool order must follow the design's pools.
      s.pools.push_back(list);
    }
    std::vector<NameList> ordered;
    for (const auto& np : s.design.name_pools)
      for (const auto& l : s.pools)
        if (l.file == np.file) ordered.push_back(l);
    s.pools = ordered;
    return s;
  }
}

}  // namespace twinprobe::testing
