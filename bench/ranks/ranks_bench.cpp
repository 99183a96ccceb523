// Benchmark of the listing-audit statistics (issue 8): 5,000 query x location
// listings of 50 positions each, every measure, 10,000 permutations per
// comparison. Usage: ranks_bench OUT_DIR [--resamples N] [--skip-full]
// Writes OUT_DIR/ranks.csv (the same synthetic data for the reference runs in
// bench/ranks/reference.py and reference.R) and prints one JSON line per
// measure: {"measure", "seconds" (CPU), "count", "check"}; "check" is a sum the
// reference scripts recompute, so the driver (bench/ranks/run) can confirm
// that both sides computed the same numbers before it compares times.
#include <sys/resource.h>

#include <algorithm>
#include <ctime>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <numbers>
#include <fstream>
#include <string>
#include <tuple>
#include <vector>

#include "analysis/listing_analysis.h"
#include "core/audit.h"
#include "core/store.h"
#include "stats/exposure.h"
#include "stats/neighbour.h"
#include "stats/rank_compare.h"
#include "stats/random.h"
#include "stats/wasserstein.h"
#include "stats/wilcoxon.h"

using namespace twinprobe;
// Process CPU time, not wall time: the machines this runs on are shared, and
// every computation here (and in the references) is single-threaded.
struct Clock {
  using time_point = std::clock_t;
  static time_point now() { return std::clock(); }
};

namespace {

constexpr int kQueries = 100, kLocations = 50, kPositions = 50;
const char* kGender[] = {"f", "m"};
const char* kOrigin[] = {"inland", "coastal", "upland"};

struct Listing {
  std::vector<int32_t> gender, origin;  // per position 1..50 (index 0 = position 1)
};

// Synthetic board: 50 candidates per stratum, gender and origin uniform,
// score = merit (normal) + 0.3 for inland; the list is the candidates by
// score, best first. Seeded stats::Rng(1): the data are the same everywhere.
std::vector<Listing> MakeData() {
  stats::Rng rng(1);
  auto normal = [&] {  // Box-Muller
    double u1 = rng.Uniform(), u2 = rng.Uniform();
    return std::sqrt(-2 * std::log(1 - u1)) * std::cos(2 * std::numbers::pi * u2);
  };
  std::vector<Listing> out;
  for (int s = 0; s < kQueries * kLocations; ++s) {
    std::vector<std::tuple<double, int32_t, int32_t>> pool;
    for (int c = 0; c < kPositions; ++c) {
      int32_t g = static_cast<int32_t>(rng.Below(2)), o = static_cast<int32_t>(rng.Below(3));
      pool.emplace_back(normal() + (o == 0 ? 0.3 : 0.0), g, o);
    }
    std::sort(pool.begin(), pool.end(), [](const auto& a, const auto& b) { return std::get<0>(a) > std::get<0>(b); });
    Listing l;
    for (const auto& [score, g, o] : pool) {
      l.gender.push_back(g);
      l.origin.push_back(o);
    }
    out.push_back(std::move(l));
  }
  return out;
}

double Seconds(Clock::time_point since) { return static_cast<double>(Clock::now() - since) / CLOCKS_PER_SEC; }

void Report(const char* measure, double seconds, int64_t count, double check) {
  std::printf("{\"measure\": \"%s\", \"seconds\": %.6f, \"count\": %lld, \"check\": %.17g}\n", measure, seconds,
              static_cast<long long>(count), check);
  std::fflush(stdout);
}

// Positions (1-based) of origin level `o` in a listing.
std::vector<double> PositionsOf(const Listing& l, int32_t o) {
  std::vector<double> v;
  for (int p = 0; p < kPositions; ++p)
    if (l.origin[static_cast<size_t>(p)] == o) v.push_back(p + 1);
  return v;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc < 2) {
    std::fprintf(stderr, "usage: ranks_bench OUT_DIR [--resamples N] [--skip-full]\n");
    return 2;
  }
  const std::string out_dir = argv[1];
  int64_t resamples = 10000;
  bool skip_full = false;
  for (int i = 2; i < argc; ++i) {
    std::string a = argv[i];
    if (a == "--resamples" && i + 1 < argc) resamples = std::atoll(argv[++i]);
    else if (a == "--skip-full") skip_full = true;
  }
  auto t0 = Clock::now();
  std::vector<Listing> data = MakeData();
  {
    std::ofstream csv(out_dir + "/ranks.csv");
    csv << "listing,query,location,position,item,gender,origin\n";
    for (size_t s = 0; s < data.size(); ++s)
      for (int p = 0; p < kPositions; ++p)
        csv << "L" << s + 1 << ",q" << s / kLocations + 1 << ",loc" << s % kLocations + 1 << "," << p + 1 << ",K"
            << s + 1 << "-" << p + 1 << "," << kGender[data[s].gender[static_cast<size_t>(p)]] << ","
            << kOrigin[data[s].origin[static_cast<size_t>(p)]] << "\n";
  }
  Report("generate", Seconds(t0), static_cast<int64_t>(data.size()), 0);

  const stats::DiscountSpec log2;
  // Exposure, top-10 share, mean and median position of inland and coastal in every listing.
  t0 = Clock::now();
  double check = 0;
  for (const auto& l : data)
    for (int32_t o = 0; o < 2; ++o) {
      std::vector<int64_t> pos;
      for (double p : PositionsOf(l, o)) pos.push_back(static_cast<int64_t>(p));
      auto s = stats::SummarisePositions(pos, log2, 10);
      check += s.exposure_mean + s.median_position;
    }
  Report("exposure", Seconds(t0), static_cast<int64_t>(data.size()), check);

  // Earth mover's distance inland vs coastal positions, the general (scipy) form.
  t0 = Clock::now();
  check = 0;
  for (const auto& l : data) check += stats::Wasserstein1(PositionsOf(l, 0), PositionsOf(l, 1));
  Report("emd", Seconds(t0), static_cast<int64_t>(data.size()), check);

  // Mann-Whitney inland vs coastal (exact: no ties, both < 50, as R).
  t0 = Clock::now();
  check = 0;
  for (const auto& l : data) check += stats::MannWhitney(PositionsOf(l, 0), PositionsOf(l, 1)).p_value;
  Report("mann_whitney", Seconds(t0), static_cast<int64_t>(data.size()), check);

  // Paired across the 5,000 strata: signed-rank test and sign test on the
  // per-listing exposure gaps (inland - coastal).
  t0 = Clock::now();
  std::vector<double> gaps;
  for (const auto& l : data) {
    double sum[2] = {0, 0}, n[2] = {0, 0};
    for (int p = 0; p < kPositions; ++p) {
      int32_t o = l.origin[static_cast<size_t>(p)];
      if (o > 1) continue;
      sum[o] += stats::PositionWeight(p + 1, log2);
      n[o] += 1;
    }
    gaps.push_back(sum[0] / n[0] - sum[1] / n[1]);
  }
  auto sr = stats::WilcoxonSignedRank(gaps);
  auto sign = stats::SignTest(gaps);
  Report("signed_rank", Seconds(t0), static_cast<int64_t>(gaps.size()), sr.p_value + sign.p_value);

  // Permutation tests per listing (inland vs coastal): exposure gap and EMD,
  // `resamples` each.
  double perm_gap_seconds = 0, perm_emd_seconds = 0, gap_check = 0, emd_check = 0;
  for (size_t s = 0; s < data.size(); ++s) {
    stats::TwoGroupPositions tg;
    std::vector<int32_t> block;
    for (int p = 0; p < kPositions; ++p) {
      int32_t o = data[s].origin[static_cast<size_t>(p)];
      if (o > 1) continue;
      block.push_back(static_cast<int32_t>(tg.position.size()));
      tg.position.push_back(p + 1);
      tg.label.push_back(o);
    }
    tg.blocks = {block};
    std::vector<double> w;
    for (int32_t p : tg.position) w.push_back(stats::PositionWeight(p, log2));
    stats::PermutationOptions po;
    po.resamples = resamples;
    po.seed = s + 1;
    auto t = Clock::now();
    auto g = stats::PermutationTest(
        tg.label, tg.blocks, [&](const std::vector<int32_t>& lab) { return stats::ExposureGap(w, {}, lab); },
        stats::Tail::kAbsolute, po);
    perm_gap_seconds += Seconds(t);
    t = Clock::now();
    auto e = stats::PermutationTest(
        tg.label, tg.blocks, [&](const std::vector<int32_t>& lab) { return stats::PositionEmd(tg.position, {}, lab, kPositions); },
        stats::Tail::kGreater, po);
    perm_emd_seconds += Seconds(t);
    gap_check += g.p_value;
    emd_check += e.p_value;
  }
  Report("perm_gap", perm_gap_seconds, static_cast<int64_t>(data.size()), gap_check);
  Report("perm_emd", perm_emd_seconds, static_cast<int64_t>(data.size()), emd_check);

  // Neighbour disparity (gender x origin cells) within every listing.
  t0 = Clock::now();
  check = 0;
  std::vector<stats::Cell> cells;
  for (int32_t g = 0; g < 2; ++g)
    for (int32_t o = 0; o < 3; ++o) cells.push_back({g, o});
  for (const auto& l : data) {
    std::vector<std::vector<double>> hist(cells.size(), std::vector<double>(kPositions, 0.0));
    std::vector<double> count(cells.size(), 0);
    for (int p = 0; p < kPositions; ++p) {
      size_t c = static_cast<size_t>(l.gender[static_cast<size_t>(p)] * 3 + l.origin[static_cast<size_t>(p)]);
      hist[c][static_cast<size_t>(p)] += 1;
      count[c] += 1;
    }
    auto d = stats::NeighbourDisparity(
        cells, [&](size_t a, size_t b) { return stats::Wasserstein1OnGrid(hist[a], hist[b]); },
        [&](size_t c) { return count[c] > 0; });
    for (double x : d)
      if (!std::isnan(x)) check += x;
  }
  Report("neighbour", Seconds(t0), static_cast<int64_t>(data.size()), check);

  // The widest split over all 250,000 places, with its permutation test.
  t0 = Clock::now();
  stats::SplitSample sample;
  sample.cells = cells;
  sample.grid = kPositions;
  std::vector<std::vector<int32_t>> blocks;
  for (const auto& l : data) {
    std::vector<int32_t> block;
    for (int p = 0; p < kPositions; ++p) {
      block.push_back(static_cast<int32_t>(sample.position.size()));
      sample.position.push_back(p + 1);
      sample.cell.push_back(l.gender[static_cast<size_t>(p)] * 3 + l.origin[static_cast<size_t>(p)]);
    }
    blocks.push_back(std::move(block));
  }
  stats::PermutationOptions po;
  po.resamples = resamples;
  po.seed = 7;
  auto w = stats::FindWidestSplit(sample, {2, 3}, blocks, 4096, po);
  Report("widest_split", Seconds(t0), static_cast<int64_t>(w.candidates.splits.size()), w.distance + w.test.p_value);

  // Everything at once through the analysis, as `analyze` runs it: every
  // group, the reference against each other level overall and in each of the
  // 5,000 strata (2 permutation tests each), paired tests across strata,
  // neighbour disparity, the widest split.
  if (!skip_full) {
    t0 = Clock::now();
    auto opened = Store::Open(":memory:", true);
    if (!opened.ok()) return 3;
    Store& store = *opened.value();
    {
      AuditedWrite wr(store, "bench");
      Stmt ins_l = store.Prepare(
          "INSERT INTO listing(source, query, location, fetched_at, audit_seq) VALUES ('bench', ?1, ?2, 'x', ?3)");
      Stmt ins_i = store.Prepare("INSERT INTO listing_item(listing_id, position, item_key, audit_seq) VALUES (?1, ?2, ?3, ?4)");
      Stmt ins_lab = store.Prepare("INSERT INTO item_label(item_key, factor, level, audit_seq) VALUES (?1, ?2, ?3, ?4)");
      for (size_t s = 0; s < data.size(); ++s) {
        // Keys built with snprintf: g++ 12 warns falsely (-Wrestrict) on "K" + std::string at -O2.
        char query[32], location[32];
        std::snprintf(query, sizeof query, "q%zu", s / kLocations + 1);
        std::snprintf(location, sizeof location, "loc%zu", s % kLocations + 1);
        ins_l.Bind(1, query).Bind(2, location).Bind(3, wr.seq()).Run();
        int64_t id = store.LastInsertId();
        for (int p = 0; p < kPositions; ++p) {
          char key[48];
          std::snprintf(key, sizeof key, "K%zu-%d", s + 1, p + 1);
          ins_i.Bind(1, id).Bind(2, static_cast<int64_t>(p + 1)).Bind(3, key).Bind(4, wr.seq()).Run();
          ins_lab.Bind(1, key).Bind(2, "gender").Bind(3, kGender[data[s].gender[static_cast<size_t>(p)]]).Bind(4, wr.seq()).Run();
          ins_lab.Bind(1, key).Bind(2, "origin").Bind(3, kOrigin[data[s].origin[static_cast<size_t>(p)]]).Bind(4, wr.seq()).Run();
        }
      }
      wr.Commit("bench data");
    }
    Report("store_load", Seconds(t0), static_cast<int64_t>(data.size()), 0);
    t0 = Clock::now();
    ListingOptions o;
    o.resamples = resamples;
    auto r = AnalyzeListings(ReadListings(store), o);
    if (!r.ok()) return 3;
    const auto& a = r.value();
    int64_t tests = 2 * static_cast<int64_t>(a.overall.size() + a.by_stratum.size()) + (a.widest ? 1 : 0);
    Report("analyze_listings", Seconds(t0), tests, a.overall.front().exposure_gap);
  }
  rusage ru{};
  getrusage(RUSAGE_SELF, &ru);
  std::printf("{\"measure\": \"peak_rss_mb\", \"seconds\": 0, \"count\": 0, \"check\": %.1f}\n", ru.ru_maxrss / 1024.0);
  return 0;
}
