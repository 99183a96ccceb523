#pragma once
// The 1-Wasserstein (earth mover's) distance between two one-dimensional
// distributions, e.g. the positions (or scores) at which two groups appear.
//
//   W1(u, v) = integral over x of |F_u(x) - F_v(x)| dx
//
// where F_u, F_v are the (weighted) empirical distribution functions. This is
// the distance scipy.stats.wasserstein_distance computes (scipy's
// `_cdf_distance` with p = 1), and the one-dimensional case of the earth
// mover's distance of Rubner, Tomasi & Guibas (2000), IJCV 40(2):99-121 [from
// memory]. Check values (scipy.stats.wasserstein_distance documentation,
// its Examples section): W1([0,1,3],[5,6,8]) = 5; W1([0,1],[0,1]; w [3,1],[2,2]) = 0.25;
// W1([3.4,3.9,7.5,7.8],[4.5,1.4]; w [1.4,0.9,3.1,7.2],[3.2,3.5]) = 4.0781331438.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe::stats {

// Why `u`/`v` with their weights cannot be compared, or "" when they can.
// Rules as scipy: neither sample empty, every value finite, weights (when
// given) as many as values, finite, non-negative, and with a positive sum.
std::string CheckWassersteinInput(const std::vector<double>& u, const std::vector<double>& v,
                                  const std::vector<double>& u_weights, const std::vector<double>& v_weights);

// W1 between the samples `u` and `v`, each weighted by its weights (empty =
// every value weighs the same). Requires CheckWassersteinInput(...) == "".
// O((n + m) log(n + m)).
double Wasserstein1(const std::vector<double>& u, const std::vector<double>& v,
                    const std::vector<double>& u_weights = {}, const std::vector<double>& v_weights = {});

// W1 between two histograms on the same equally spaced grid (counts at
// x_0, x_0 + spacing, ...): sum over the grid of |F_u - F_v| * spacing.
// Both must have the same length and positive totals. O(grid size). Used for
// positions 1..P, where it equals Wasserstein1 on the expanded samples.
double Wasserstein1OnGrid(const std::vector<double>& u_counts, const std::vector<double>& v_counts,
                          double spacing = 1.0);

// W1 between the members labelled true and false of one pooled sample whose
// values are sorted ascending (`sorted_values[i]` carries `in_u[i]`). Both
// labels must occur. O(n): what a permutation test recomputes after each
// relabelling, without sorting again.
double Wasserstein1Split(const std::vector<double>& sorted_values, const std::vector<uint8_t>& in_u);

}  // namespace twinprobe::stats
