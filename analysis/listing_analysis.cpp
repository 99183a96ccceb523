#include "analysis/listing_analysis.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <set>
#include <tuple>

#include <cstdio>
#include <memory>

#include "core/progress.h"
#include "stats/adjust.h"
#include "stats/neighbour.h"
#include "stats/rank_compare.h"
#include "stats/rank_overlap.h"
#include "stats/wasserstein.h"

namespace twinprobe {
namespace {

using Appearance = ListingAppearance;
using ListingRow = ListingList;
using Data = ListingData;

// Global progress over every permutation test of the audit.
// Each test's callback is mapped onto one bar for the whole audit; `done`
// also advances when a test does not run, so the bar still ends at 100%.
struct ProgressTracker {
  stats::ProgressFn sink;
  int64_t total = 0, done = 0;
  // A callback for the next stretch of `span` resamples; call Finish(span) after it.
  stats::ProgressFn For() {
    if (!sink) return {};
    int64_t base = done;
    return [this, base](int64_t d, int64_t) { sink(base + d, total); };
  }
  void Finish(int64_t span) {
    done += span;
    if (sink) sink(done, total);
  }
};

std::string CellLabel(const Data& d, const std::vector<int32_t>& cell) {
  std::string s;
  for (size_t f = 0; f < cell.size(); ++f)
    s += (f ? "," : "") + d.factors[f] + "=" + d.levels[f][static_cast<size_t>(cell[f])];
  return s;
}

ListingGroup SummariseGroup(const std::vector<int64_t>& positions, const ListingOptions& o, double total_exposure,
                            int64_t total_top_k) {
  stats::PositionSummary s = stats::SummarisePositions(positions, o.discount, o.top_k);
  ListingGroup g;
  g.appearances = s.appearances;
  g.exposure = s.exposure_mean;
  g.exposure_share = total_exposure > 0 ? s.exposure_total / total_exposure : 0;
  g.top_k_share = total_top_k > 0 ? static_cast<double>(s.in_top_k) / static_cast<double>(total_top_k) : 0;
  g.mean_position = s.mean_position;
  g.median_position = s.median_position;
  return g;
}

// Reference level 0 against `other` of factor f, over the given listings.
std::optional<ListingComparison> Compare(const Data& d, size_t f, int32_t other, const std::vector<int32_t>& listings,
                                         const ListingOptions& o, uint64_t seed, ProgressTracker& progress) {
  // Units are items within a stratum: an item shown in several lists of one
  // query x location keeps one label across them when labels are shuffled.
  stats::TwoGroupPositions s;
  std::map<std::pair<int32_t, int32_t>, int32_t> unit_of;  // (stratum, item) -> unit
  std::map<int32_t, size_t> block_of;                      // stratum -> block
  for (int32_t li : listings) {
    const int32_t stratum = d.listings[static_cast<size_t>(li)].stratum;
    for (int32_t ai : d.listings[static_cast<size_t>(li)].appearances) {
      const Appearance& a = d.appearances[static_cast<size_t>(ai)];
      int32_t level = d.item_level[static_cast<size_t>(a.item)][f];
      if (level != 0 && level != other) continue;
      auto [uit, new_unit] = unit_of.emplace(std::make_pair(stratum, a.item), static_cast<int32_t>(s.label.size()));
      if (new_unit) {
        s.label.push_back(level == 0 ? 0 : 1);
        auto [bit, new_block] = block_of.emplace(stratum, s.blocks.size());
        if (new_block) s.blocks.emplace_back();
        s.blocks[bit->second].push_back(uit->second);
      }
      s.position.push_back(a.position);
      s.unit.push_back(uit->second);
    }
  }
  const int64_t ref_units = std::count(s.label.begin(), s.label.end(), 0);
  if (ref_units == 0 || ref_units == static_cast<int64_t>(s.label.size())) {
    progress.Finish(2 * o.resamples);  // the tests counted in the total do not run
    return std::nullopt;
  }
  stats::PermutationOptions po;
  po.resamples = o.resamples;
  po.seed = seed;
  po.progress = progress.For();  // CompareGroups reports both of its tests as one stretch
  stats::GroupComparison c = stats::CompareGroups(s, o.discount, po);
  progress.Finish(2 * o.resamples);
  ListingComparison r;
  r.factor = d.factors[f];
  r.reference = d.levels[f][0];
  r.other = d.levels[f][static_cast<size_t>(other)];
  r.n_reference = c.n_a;
  r.n_other = c.n_b;
  r.exposure_gap = c.exposure_gap;
  r.emd = c.emd;
  r.mann_whitney_p = c.mann_whitney.p_value;
  r.gap_p = c.gap_test.p_value;
  r.emd_p = c.emd_test.p_value;
  return r;
}

// Adjusts the permutation p-values of one comparison across its strata with
// the study's method (R's p.adjust semantics). Leaves them empty when the
// method is unknown (the design file rejects such a method before this).
void AdjustAcrossStrata(std::vector<ListingComparison>& family, const std::string& method) {
  auto m = stats::ParseAdjustment(method);
  if (!m || family.empty()) return;
  std::vector<double> gap, emd;
  for (const auto& c : family) {
    gap.push_back(c.gap_p);
    emd.push_back(c.emd_p);
  }
  gap = stats::AdjustP(gap, *m);
  emd = stats::AdjustP(emd, *m);
  for (size_t i = 0; i < family.size(); ++i) {
    family[i].gap_p_adjusted = gap[i];
    family[i].emd_p_adjusted = emd[i];
  }
}

std::vector<DisparityEntry> Entries(const std::vector<std::string>& names, const std::vector<double>& values,
                                    size_t k, bool largest) {
  std::vector<DisparityEntry> out;
  for (size_t i : stats::TopK(values, k, largest)) out.push_back({names[i], values[i]});
  return out;
}

}  // namespace

stats::ProgressFn TerminalProgress(const std::string& label) {
  auto bar = std::make_shared<Progress>(label, 0);
  if (!bar->enabled()) return {};  // no callback: the tests skip the bookkeeping
  return [bar](int64_t done, int64_t total) {
    bar->SetTotal(total);
    bar->Update(done);
    if (done >= total) bar->Finish();
  };
}

Result<ListingAudit> AnalyzeListings(const ListingData& d, const ListingOptions& o) {
  ListingAudit r;
  r.listings = static_cast<int64_t>(d.listings.size());
  r.present = r.listings > 0;
  if (!r.present) return r;
  r.appearances = static_cast<int64_t>(d.appearances.size());
  r.items = static_cast<int64_t>(d.item_keys.size());
  r.strata = static_cast<int64_t>(d.strata.size());
  r.factors = d.factors;
  r.levels = d.levels;
  r.discount = stats::DiscountName(o.discount);
  r.top_k = o.top_k;
  r.resamples = o.resamples;
  r.seed = o.seed;
  r.correction = o.correction;
  const size_t nf = d.factors.size();

  // Totals for the shares: every appearance counts, labelled or not.
  double total_exposure = 0;
  int64_t total_top_k = 0;
  for (const auto& a : d.appearances) {
    total_exposure += stats::PositionWeight(a.position, o.discount);
    if (a.position <= o.top_k) ++total_top_k;
    bool labelled = nf > 0;
    for (size_t f = 0; f < nf; ++f) labelled = labelled && d.item_level[static_cast<size_t>(a.item)][f] >= 0;
    if (labelled) ++r.labelled_appearances;
  }
  if (nf == 0) return r;

  // Groups: every level of every factor, then every cell.
  for (size_t f = 0; f < nf; ++f)
    for (size_t l = 0; l < d.levels[f].size(); ++l) {
      std::vector<int64_t> pos;
      for (const auto& a : d.appearances)
        if (d.item_level[static_cast<size_t>(a.item)][f] == static_cast<int32_t>(l)) pos.push_back(a.position);
      ListingGroup g = SummariseGroup(pos, o, total_exposure, total_top_k);
      g.factor = d.factors[f];
      g.label = d.factors[f] + "=" + d.levels[f][l];
      r.groups.push_back(g);
    }
  // Cells: mixed-radix enumeration of every combination of levels.
  std::vector<stats::Cell> cells;
  {
    stats::Cell c(nf, 0);
    for (;;) {
      cells.push_back(c);
      size_t f = 0;
      while (f < nf && ++c[f] == static_cast<int32_t>(d.levels[f].size())) c[f++] = 0;
      if (f == nf) break;
    }
  }
  auto cell_of_item = [&](int32_t item) -> int32_t {
    const auto& lv = d.item_level[static_cast<size_t>(item)];
    int32_t idx = 0, mult = 1;
    for (size_t f = 0; f < nf; ++f) {
      if (lv[f] < 0) return -1;
      idx += lv[f] * mult;
      mult *= static_cast<int32_t>(d.levels[f].size());
    }
    return idx;
  };
  std::string all_factors;
  for (size_t f = 0; f < nf; ++f) all_factors += (f ? "," : "") + d.factors[f];
  if (nf > 1)
    for (size_t c = 0; c < cells.size(); ++c) {
      std::vector<int64_t> pos;
      for (const auto& a : d.appearances)
        if (cell_of_item(a.item) == static_cast<int32_t>(c)) pos.push_back(a.position);
      if (pos.empty()) continue;
      ListingGroup g = SummariseGroup(pos, o, total_exposure, total_top_k);
      g.factor = all_factors;
      g.label = CellLabel(d, cells[c]);
      r.groups.push_back(g);
    }

  // Comparisons: reference against each other level, over all listings and
  // within each stratum.
  std::vector<std::vector<int32_t>> listings_of_stratum(d.strata.size());
  std::vector<int32_t> all_listings(d.listings.size());
  std::iota(all_listings.begin(), all_listings.end(), 0);
  for (size_t li = 0; li < d.listings.size(); ++li)
    listings_of_stratum[static_cast<size_t>(d.listings[li].stratum)].push_back(static_cast<int32_t>(li));
  int64_t comparisons = 0;
  for (size_t f = 0; f < nf; ++f) comparisons += static_cast<int64_t>(d.levels[f].size()) - 1;
  const bool stratified = d.strata.size() > 1;
  ProgressTracker progress{o.progress, 0, 0};
  progress.total = o.resamples * (2 * comparisons * (1 + (stratified ? static_cast<int64_t>(d.strata.size()) : 0)) + 1);
  uint64_t stream = 0;
  for (size_t f = 0; f < nf; ++f)
    for (int32_t other = 1; other < static_cast<int32_t>(d.levels[f].size()); ++other) {
      if (auto c = Compare(d, f, other, all_listings, o, o.seed + ++stream, progress)) r.overall.push_back(*c);
      if (!stratified) continue;
      std::vector<double> gaps;
      std::vector<ListingComparison> family;
      for (size_t s = 0; s < d.strata.size(); ++s) {
        auto c = Compare(d, f, other, listings_of_stratum[s], o, o.seed + ++stream, progress);
        if (!c) continue;
        c->query = d.strata[s].first;
        c->location = d.strata[s].second;
        gaps.push_back(c->exposure_gap);
        family.push_back(*c);
      }
      AdjustAcrossStrata(family, o.correction);
      r.by_stratum.insert(r.by_stratum.end(), family.begin(), family.end());
      if (gaps.empty()) continue;
      ListingPaired p;
      p.factor = d.factors[f];
      p.reference = d.levels[f][0];
      p.other = d.levels[f][static_cast<size_t>(other)];
      p.strata = static_cast<int64_t>(gaps.size());
      p.wilcoxon = stats::WilcoxonSignedRank(gaps);
      p.sign = stats::SignTest(gaps);
      r.paired.push_back(p);
    }

  // Neighbour disparity within each stratum, aggregated by group, query and
  // location.
  {
    std::vector<double> cell_sum(cells.size(), 0), cell_n(cells.size(), 0);
    std::map<std::string, std::pair<double, double>> by_query, by_location;
    for (size_t s = 0; s < d.strata.size(); ++s) {
      int32_t grid = 1;
      for (int32_t li : listings_of_stratum[s])
        for (int32_t ai : d.listings[static_cast<size_t>(li)].appearances)
          grid = std::max(grid, d.appearances[static_cast<size_t>(ai)].position);
      std::vector<std::vector<double>> hist(cells.size(), std::vector<double>(static_cast<size_t>(grid), 0.0));
      std::vector<double> count(cells.size(), 0);
      for (int32_t li : listings_of_stratum[s])
        for (int32_t ai : d.listings[static_cast<size_t>(li)].appearances) {
          const Appearance& a = d.appearances[static_cast<size_t>(ai)];
          int32_t c = cell_of_item(a.item);
          if (c < 0) continue;
          hist[static_cast<size_t>(c)][static_cast<size_t>(a.position - 1)] += 1;
          count[static_cast<size_t>(c)] += 1;
        }
      auto disparity = stats::NeighbourDisparity(
          cells, [&](size_t a, size_t b) { return stats::Wasserstein1OnGrid(hist[a], hist[b]); },
          [&](size_t c) { return count[c] > 0; });
      for (size_t c = 0; c < cells.size(); ++c) {
        if (std::isnan(disparity[c])) continue;
        cell_sum[c] += disparity[c];
        cell_n[c] += 1;
        auto& q = by_query[d.strata[s].first];
        q.first += disparity[c];
        q.second += 1;
        auto& l = by_location[d.strata[s].second];
        l.first += disparity[c];
        l.second += 1;
      }
    }
    std::vector<std::string> names;
    std::vector<double> values;
    for (size_t c = 0; c < cells.size(); ++c) {
      names.push_back(CellLabel(d, cells[c]));
      values.push_back(cell_n[c] > 0 ? cell_sum[c] / cell_n[c] : std::nan(""));
    }
    r.disparity.push_back({"group", Entries(names, values, o.top_n, true), Entries(names, values, o.top_n, false)});
    using Table = std::map<std::string, std::pair<double, double>>;
    for (const auto& [dimension, table] :
         std::vector<std::pair<std::string, Table*>>{{"query", &by_query}, {"location", &by_location}}) {
      names.clear();
      values.clear();
      for (const auto& [name, sum_n] : *table) {
        names.push_back(name);
        values.push_back(sum_n.first / sum_n.second);
      }
      if (names.size() < 2) continue;  // one query (or location, or none named): nothing to rank
      r.disparity.push_back(
            {dimension, Entries(names, values, o.top_n, true), Entries(names, values, o.top_n, false)});
    }
  }

  // The widest split over all listings.
  {
    stats::SplitSample sample;
    sample.cells = cells;
    std::vector<std::vector<int32_t>> blocks(d.strata.size());
    std::map<std::pair<int32_t, int32_t>, int32_t> unit_of;  // (stratum, item) -> unit
    for (const auto& l : d.listings)
      for (int32_t ai : l.appearances) {
        const Appearance& a = d.appearances[static_cast<size_t>(ai)];
        int32_t c = cell_of_item(a.item);
        if (c < 0) continue;
        auto [uit, new_unit] = unit_of.emplace(std::make_pair(l.stratum, a.item), static_cast<int32_t>(sample.cell.size()));
        if (new_unit) {
          sample.cell.push_back(c);
          blocks[static_cast<size_t>(l.stratum)].push_back(uit->second);
        }
        sample.position.push_back(a.position);
        sample.unit.push_back(uit->second);
        sample.grid = std::max(sample.grid, a.position);
      }
    std::vector<int32_t> levels_per_factor;
    bool splittable = !sample.position.empty();
    for (const auto& lv : d.levels) {
      levels_per_factor.push_back(static_cast<int32_t>(lv.size()));
      splittable = splittable && lv.size() >= 2;
    }
    if (splittable) {
      stats::PermutationOptions po;
      po.resamples = o.resamples;
      po.seed = o.seed + ++stream;
      po.progress = progress.For();
      stats::WidestSplit w = stats::FindWidestSplit(sample, levels_per_factor, blocks, o.max_splits, po);
      const stats::Split& best = w.candidates.splits[w.best];
      ListingSplit s;
      for (size_t k = 0; k < best.factors.size(); ++k) {
        const size_t f = static_cast<size_t>(best.factors[k]);
        std::vector<std::string> block_text(static_cast<size_t>(best.blocks[k]));
        for (size_t l = 0; l < d.levels[f].size(); ++l) {
          auto& t = block_text[static_cast<size_t>(best.block_of[k][l])];
          t += (t.empty() ? "" : "+") + d.levels[f][l];
        }
        std::string text = d.factors[f] + ": ";
        for (size_t b = 0; b < block_text.size(); ++b) text += (b ? " | " : "") + block_text[b];
        s.description += (k ? " x " : "") + text;
      }
      s.parts = best.parts;
      s.distance = w.distance;
      s.p_value = w.test.p_value;
      s.resamples = w.test.resamples;
      s.candidates = w.candidates.splits.size();
      s.exhaustive = w.candidates.exhaustive;
      r.widest = s;
    }
    progress.Finish(o.resamples);
  }

  // Personalised listings: overlap between lists of one stratum seen by
  // different profiles (and by the same profile twice: the noise floor).
  {
    std::map<std::pair<std::string, std::string>, std::pair<double, int64_t>> acc;
    for (const auto& ls : listings_of_stratum)
      for (size_t i = 0; i < ls.size(); ++i)
        for (size_t j = i + 1; j < ls.size(); ++j) {
          const auto& a = d.listings[static_cast<size_t>(ls[i])];
          const auto& b = d.listings[static_cast<size_t>(ls[j])];
          if (a.seen_by.empty() || b.seen_by.empty()) continue;
          auto items = [&](const ListingRow& l) {
            std::vector<std::string> v;
            for (int32_t ai : l.appearances)
              v.push_back(d.item_keys[static_cast<size_t>(d.appearances[static_cast<size_t>(ai)].item)]);
            return v;
          };
          auto key = std::minmax(a.seen_by, b.seen_by);
          auto& cell = acc[{key.first, key.second}];
          cell.first += stats::JaccardDistance(items(a), items(b));
          cell.second += 1;
        }
    for (const auto& [key, v] : acc)
      r.overlap.push_back({key.first, key.second, v.second, v.first / static_cast<double>(v.second)});
  }
  return r;
}

Result<ListingAudit> AnalyzeStudyListings(const ListingData& data, const AnalysisPlan& plan,
                                          std::optional<int64_t> plan_seed) {
  ListingOptions o;
  o.correction = plan.correction;
  o.alpha = plan.alpha;
  if (plan_seed) o.seed = static_cast<uint64_t>(*plan_seed);
  if (data.stored_rows > 0) o.progress = TerminalProgress("listing permutation tests");
  return AnalyzeListings(data, o);
}

}  // namespace twinprobe
