// Writes the benchmark workload for bench/import/run: a `pairs` file (one
// row per probe, two arms per vacancy) of invented Veldmark data with every
// optional column filled the way a real dataset would fill it.
//
//   import_bench --rows 1000000 --out pairs.csv
//
// The numbers are drawn from a fixed seed (stats::Rng), so every run of the
// benchmark imports the same bytes.
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <iostream>
#include <string>

#include "core/clock.h"
#include "stats/random.h"

int main(int argc, char** argv) {
  long long rows = 1000000;
  std::string out = "pairs.csv";
  for (int i = 1; i + 1 < argc; i += 2) {
    if (std::strcmp(argv[i], "--rows") == 0) rows = std::atoll(argv[i + 1]);
    else if (std::strcmp(argv[i], "--out") == 0) out = argv[i + 1];
  }
  if (rows < 2 || rows % 2) {
    std::cerr << "import_bench: --rows must be even and at least 2\n";
    return 2;
  }
  std::ofstream f(out, std::ios::binary);
  if (!f) {
    std::cerr << "import_bench: cannot write " << out << "\n";
    return 1;
  }
  const char* occupations[] = {"bookkeeper", "warehouse clerk", "care assistant", "junior developer"};
  const char* regions[] = {"Orlinde", "Brakkeport", "Tessvale", "North Fen"};
  const char* arms[] = {"inland", "coastal"};
  const double callback[] = {0.28, 0.19};
  twinprobe::stats::Rng rng(20270301);
  const int64_t start = *twinprobe::ParseIsoTime("2027-03-01T08:00");
  f << "vacancy,arm,outcome,sent_at,responded_at,occupation,region\r\n";
  char line[256];
  for (long long v = 0; v < rows / 2; ++v) {
    const char* occupation = occupations[rng.Below(4)];
    const char* region = regions[rng.Below(4)];
    for (int a = 0; a < 2; ++a) {
      int64_t sent = start + static_cast<int64_t>(v / 500) * 3600 + rng.Between(0, 3 * 86400);
      bool positive = rng.Bernoulli(callback[a]);
      std::string responded;
      if (positive || rng.Bernoulli(0.3)) responded = twinprobe::FormatIsoTime(sent + rng.Between(3600, 35 * 86400));
      std::snprintf(line, sizeof line, "V%07lld,%s,%s,%s,%s,%s,%s\r\n", v + 1, arms[a], positive ? "1" : "0",
                    twinprobe::FormatIsoTime(sent).c_str(), responded.c_str(), occupation, region);
      f << line;
    }
  }
  f.close();
  if (!f) {
    std::cerr << "import_bench: writing " << out << " failed\n";
    return 1;
  }
  return 0;
}
