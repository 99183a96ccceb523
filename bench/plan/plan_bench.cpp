// Benchmark: planning 100,000 vacancies with 4 arms and 6 strata (the goal
// from issue 4: under 1 s). Times AssignProbes in memory (the planning
// itself), and for context the one-attribute proof over the same plan and
// storing the plan in a SQLite file. Prints one line per measurement:
//   NAME seconds=S probes=N
// Usage: plan_bench [VACANCIES] [REPEATS]
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>

#include "core/store.h"
#include "planner/assign.h"
#include "planner/design_file.h"
#include "planner/materials.h"
#include "planner/one_difference.h"
#include "planner/plan_store.h"

using namespace twinprobe;

namespace {

// Two factors of two levels (4 arms), names signal origin, age_band shows
// through a field; 2 occupations x 3 regions = 6 strata.
std::string DesignText(const std::string& kind) {
  return "[study]\nid = \"bench\"\nseed = 424242\nkind = \"" + kind +
         "\"\n"
         "[[factor]]\nname = \"origin\"\nlevels = [\"inland\", \"coastal\"]\n"
         "[[factor]]\nname = \"age_band\"\nlevels = [\"younger\", \"older\"]\nfields = { birth_year = [\"2001\", \"1977\"] }\n"
         "[arms]\ninclude = \"all\"\n"
         "[profiles]\nmailbox = \"{given}.{family}.{n}@mail.example\"\n"
         "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"inland\"\nfile = \"inland.csv\"\n"
         "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"coastal\"\nfile = \"coastal.csv\"\n"
         "[templates]\nfiles = [\"t1.md\", \"t2.md\", \"t3.md\", \"t4.md\"]\n"
         "[schedule]\nstart = \"2027-03-01\"\ngap_hours = [24, 72]\nsets_per_day = 200\n"
         "[strata]\ncolumns = [\"occupation\", \"region\"]\n"
         "[ethics]\ncap_per_employer = 16\n";
}

double Seconds(std::chrono::steady_clock::time_point since) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
}

}  // namespace

int main(int argc, char** argv) {
  const int n = argc > 1 ? std::atoi(argv[1]) : 100000;
  const int repeats = argc > 2 ? std::atoi(argv[2]) : 5;
  const char* occupations[] = {"bookkeeper", "care assistant"};
  const char* regions[] = {"North Fen", "Harbour Coast", "Upland"};
  std::vector<Vacancy> vacancies(static_cast<size_t>(n));
  for (int i = 0; i < n; ++i) {
    Vacancy& v = vacancies[static_cast<size_t>(i)];
    char ref[16];
    std::snprintf(ref, sizeof ref, "V%06d", i + 1);
    v.ref = ref;
    v.employer = "Employer " + std::to_string(i / 4) + " (invented)";  // 4 vacancies per employer
    v.strata["occupation"] = occupations[i % 2];
    v.strata["region"] = regions[(i / 2) % 3];
    v.fields = {{"vacancy", v.ref}, {"employer", v.employer}, {"occupation", v.strata["occupation"]},
                {"region", v.strata["region"]}};
    v.line = i + 2;
  }
  std::vector<NameList> pools(2);
  for (int p = 0; p < 2; ++p) {
    pools[static_cast<size_t>(p)].file = p ? "coastal.csv" : "inland.csv";
    for (int i = 0; i < 200; ++i) {
      pools[static_cast<size_t>(p)].names.emplace_back("Given" + std::to_string(p) + "n" + std::to_string(i), "Family");
      pools[static_cast<size_t>(p)].extra.emplace_back();
      pools[static_cast<size_t>(p)].lines.push_back(i + 2);
    }
  }

  for (const char* kind : {"sets", "unpaired"}) {
    auto design = ParseDesign(DesignText(kind), "bench.toml", "");
    if (!design.ok()) {
      std::fprintf(stderr, "%s\n", design.error().Message().c_str());
      return 1;
    }
    double best = 1e9;
    Result<Plan> plan = Internal("not run");
    for (int r = 0; r < repeats; ++r) {
      auto t0 = std::chrono::steady_clock::now();
      plan = AssignProbes(design.value(), vacancies, pools);
      best = std::min(best, Seconds(t0));
      if (!plan.ok()) {
        std::fprintf(stderr, "%s\n", plan.error().Message().c_str());
        return 1;
      }
    }
    std::printf("assign_%s seconds=%.4f probes=%zu vacancies=%d\n", kind, best, plan.value().probes.size(), n);

    if (std::string(kind) == "sets") {
      // The one-attribute proof over the same plan (what check adds).
      std::map<std::string, TemplateDoc> docs;
      for (const auto& t : design.value().templates) {
        TemplateDoc d;
        d.path = t;
        d.segments = {{true, "full_name", t, 1, 1}, {true, "birth_year", t, 2, 1}, {true, "occupation", t, 3, 1}};
        docs[t] = d;
      }
      auto t0 = std::chrono::steady_clock::now();
      auto materials = PlannedMaterials(design.value(), vacancies, pools, plan.value());
      auto proof = ProveOneDifference(design.value(), docs, materials.value());
      std::printf("prove_sets seconds=%.4f probes=%zu leaks=%zu\n", Seconds(t0), materials.value().size(),
                  proof.value().leaks.size());

      // Storing the plan (SQLite, one transaction), for context.
      std::string path = (std::filesystem::temp_directory_path() / "twinprobe-plan-bench.db").string();
      std::filesystem::remove(path);
      auto store = Store::Open(path, true);
      t0 = std::chrono::steady_clock::now();
      auto stored = StorePlan(*store.value(), design.value(), vacancies, plan.value());
      std::printf("store_sets seconds=%.4f probes=%lld\n", Seconds(t0), static_cast<long long>(stored.value().probes));
      store.value().reset();
      std::filesystem::remove(path);
      std::filesystem::remove(path + "-wal");
      std::filesystem::remove(path + "-shm");
    }
  }
  return 0;
}
