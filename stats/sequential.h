#pragma once
// Group-sequential monitoring of the paired design: the exact conditional
// McNemar test repeated at interim looks, with Lan–DeMets alpha spending.
//
// At look k the study has n_k discordant sets and b_k of them favour the
// reference arm. Given the discordant counts, under "no difference" b_k is a
// random walk with Binomial(n_k - n_{k-1}, 1/2) steps (McNemar 1947's
// conditioning, applied look by look). The test stops at the first look with
// b_k <= l_k or b_k >= n_k - l_k (symmetric two-sided boundaries).
//
// Spending (Lan & DeMets 1983, Biometrika 70:659–663; details from memory): alpha(t) is the
// cumulative two-sided type I error allowed by information fraction t in
// [0, 1], alpha(1) = alpha. As in rpact (getDesignGroupSequential, sided = 2)
// and gsDesign, a two-sided design spends a one-sided alpha/2 function on
// each side:
//   O'Brien–Fleming type: alpha(t) = 2 * 2 * (1 - Phi(z_{1 - alpha/4} / sqrt(t)))
//   Pocock type:          alpha(t) = alpha * ln(1 + (e - 1) t)
// (for the Pocock type the split makes no difference).
//
// Exact boundaries: at each look l_k is the largest integer such that the
// exact probability, computed by enumeration of the walk, of crossing at any
// look up to k is <= alpha(t_k). Discreteness leaves part of alpha(t_k)
// unspent; it carries over to later looks. The exact type I error is the sum
// of the crossing probabilities and is <= alpha by construction.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe::stats {

enum class Spending { kOBrienFleming, kPocock };

// Parses "obf" / "pocock"; false for anything else.
bool ParseSpending(const std::string& name, Spending& out);
std::string SpendingName(Spending s);  // "obf" | "pocock"
std::string SpendingLabel(Spending s); // "O'Brien–Fleming-type" | "Pocock-type"

// Cumulative two-sided alpha spent by information fraction t (clamped to
// [0, 1]). Requires 0 < alpha < 1.
double AlphaSpent(Spending s, double alpha, double t);

// One look: its information fraction and discordant count.
struct SequentialLook {
  double information = 1;    // t_k in (0, 1], strictly increasing; the last may be 1
  int64_t n_discordant = 0;  // nondecreasing
};

struct SequentialBoundary {
  double information = 1;
  int64_t n_discordant = 0;
  // Stop when b <= lower or b >= n_discordant - lower; -1: cannot stop here.
  int64_t lower = -1;
  double alpha_allowed = 0;  // alpha(t_k), cumulative
  double alpha_spent = 0;    // exact P(stop at or before look k | no difference)
  double alpha_here = 0;     // exact P(stop at look k | no difference)
  int64_t upper() const { return n_discordant - lower; }  // the other side of the boundary
  bool crossed_by(int64_t b) const { return lower >= 0 && (b <= lower || b >= upper()); }
};

// Exact boundaries for the looks. Requires nondecreasing n_discordant,
// strictly increasing information in (0, 1], 0 < alpha < 1.
std::vector<SequentialBoundary> ExactSequentialBoundaries(const std::vector<SequentialLook>& looks, double alpha,
                                                          Spending spending);

// Boundaries of new looks after looks already taken (Lan & DeMets 1983: the
// spending function fixes only how much alpha is spent by each information
// time, so looks may be added when they happen). `taken` are the boundaries
// as they were set (their `lower` never changes); the walk is conditioned on
// not having crossed them, and each new look widens its boundary only while
// the exact cumulative crossing probability stays within alpha(t_k). Returns
// `taken` (alpha_here and alpha_spent recomputed exactly from their lowers)
// followed by one boundary per new look. With no taken looks it equals
// ExactSequentialBoundaries. Requires nondecreasing n_discordant across both.
std::vector<SequentialBoundary> ContinueSequentialBoundaries(const std::vector<SequentialBoundary>& taken,
                                                             const std::vector<SequentialLook>& looks, double alpha,
                                                             Spending spending);

// Stage-wise ordering p-value (Armitage 1957; Fairbanks & Madsen 1982;
// Jennison & Turnbull 2000, §8.4; references from memory) after stopping at look `stop` (0-based)
// with b_observed: the probability under no difference of stopping at an
// earlier look, plus that of reaching look `stop` and being at least as far
// from n/2 there. For a look that did not stop, the same formula gives the
// p-value "if the study ended here"; it is at most 1.
double StagewisePValue(const std::vector<SequentialBoundary>& bounds, size_t stop, int64_t b_observed);

// Exact probability of stopping at some look under b ~ fair walk, by nested
// enumeration of the increments (an independent check of the recursion for
// small counts; cost grows as the product of the increments).
double EnumeratedTypeIError(const std::vector<SequentialBoundary>& bounds);

}  // namespace twinprobe::stats
