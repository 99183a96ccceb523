// Runs R (Rscript, installed by scripts/setup as r-base-core) live on fresh
// random tables and checks that twinprobe agrees to 1e-9. The seed comes
// from the clock and is printed, so a failure can be replayed with
// TWINPROBE_R_SEED=<seed>. A missing Rscript fails the test: it is never
// skipped silently.
#include <catch2/catch.hpp>

#include <chrono>
#include <cmath>
#include <cstdlib>
#include <iostream>
#include <sstream>

#include "stats/random.h"
#include "stats/reference_check.h"
#include "testing/testing.h"

using namespace twinprobe;

namespace {

std::string Csv(std::initializer_list<double> v) {
  std::ostringstream o;
  o.precision(17);
  bool first = true;
  for (double x : v) o << (first ? "" : ",") << x, first = false;
  return o.str();
}

}  // namespace

TEST_CASE("reference: R agrees live on fresh random tables") {
  REQUIRE(std::system("command -v Rscript >/dev/null 2>&1") == 0);  // scripts/setup installs r-base-core
  uint64_t seed = static_cast<uint64_t>(std::chrono::system_clock::now().time_since_epoch().count());
  if (const char* s = std::getenv("TWINPROBE_R_SEED")) seed = std::strtoull(s, nullptr, 10);
  std::cout << "r_live: seed " << seed << " (replay with TWINPROBE_R_SEED=" << seed << ")\n";
  INFO("seed " << seed);
  stats::Rng rng(seed);
  auto count = [&](int64_t hi) { return rng.Between(0, rng.Bernoulli(0.7) ? std::min<int64_t>(hi, 40) : hi); };
  auto conf = [&] { return rng.Bernoulli(0.5) ? 0.95 : (rng.Bernoulli(0.5) ? 0.9 : 0.99); };
  auto alt = [&] { return static_cast<double>(rng.Between(0, 2)); };
  std::ostringstream cases;
  for (int i = 0; i < 40; ++i) {
    int64_t n = rng.Between(1, rng.Bernoulli(0.7) ? 60 : 200000);
    double p0 = rng.Bernoulli(0.5) ? 0.5 : 0.01 + 0.98 * rng.Uniform();
    cases << "binom\t" << Csv({double(rng.Between(0, n)), double(n), p0, alt(), conf()}) << "\n";
    cases << "wilson\t" << Csv({double(rng.Between(0, n)), double(n), conf()}) << "\n";
  }
  for (int i = 0; i < 40; ++i) {
    cases << "mcnemar\t" << Csv({double(count(5000)), double(count(5000)), double(count(5000)), double(count(5000)), conf()})
          << "\n";
    cases << "newcombe\t" << Csv({double(count(2000)), double(count(2000)), double(count(2000)), double(count(2000)), conf()})
          << "\n";
    cases << "fisher\t" << Csv({double(count(800)), double(count(800)), double(count(800)), double(count(800)), alt(), conf()})
          << "\n";
  }
  for (int i = 0; i < 15; ++i) {
    std::ostringstream strata;
    int k = static_cast<int>(rng.Between(2, 6));
    for (int j = 0; j < k; ++j) {
      int64_t t[4];
      do {
        for (auto& v : t) v = rng.Between(0, 25);
      } while (t[0] + t[1] + t[2] + t[3] < 2);
      strata << (j ? ";" : "") << t[0] << "," << t[1] << "," << t[2] << "," << t[3];
    }
    cases << "mh\t" << strata.str() << "|0," << conf() << "\n";
    cases << "mh_exact\t" << strata.str() << "|" << alt() << "," << conf() << "\n";
  }
  const char* methods[] = {"bonferroni", "holm", "hochberg", "hommel", "bh", "by"};
  for (const char* m : methods) {
    std::ostringstream ps;
    ps.precision(17);
    int len = static_cast<int>(rng.Between(1, 30));
    for (int j = 0; j < len; ++j) ps << (j ? "," : "") << std::pow(rng.Uniform(), 3);
    cases << "adjust\t" << m << "|" << ps.str() << "\n";
  }
  testing::TempDir dir;
  testing::WriteFile(dir / "cases.tsv", cases.str());
  std::string cmd = "cd '" + testing::SourceDir() + "/tests/reference' && Rscript reference.R '" + (dir / "cases.tsv") +
                    "' '" + (dir / "out.tsv") + "' 2>'" + (dir / "err.txt") + "'";
  int rc = std::system(cmd.c_str());
  INFO(testing::ReadFile(dir / "err.txt"));
  REQUIRE(rc == 0);
  auto s = testing::CheckReferenceText(testing::ReadFile(dir / "out.tsv"));
  for (const auto& f : s.failures) UNSCOPED_INFO(f);
  CHECK(s.failures.empty());
  CHECK(s.lines == 40 * 2 + 40 * 3 + 15 * 2 + 6);
  std::cout << "r_live: " << s.lines << " cases, " << s.checks << " values at 1e-9 (max relative error "
            << s.max_rel_error << "), " << s.loose_checks << " within R's uniroot tolerance\n";
}
