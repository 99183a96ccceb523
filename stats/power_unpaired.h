#pragma once
// Power and sample size for the unpaired design (one probe per vacancy, two
// independent arms of n vacancies each), normal approximation.
//
// Definition: exactly R's power.prop.test (stats package; R 4.2.2 source
// read with `Rscript -e power.prop.test`). With q = 1 - p,
// z = qnorm(1 - alpha / sides):
//   strict = false (R's default):
//     power = Phi((sqrt(n) |p1 - p2| - z sqrt((p1 + p2)(1 - (p1 + p2)/2)))
//                 / sqrt(p1 q1 + p2 q2))
//   strict = true, sides = 2: adds the far tail,
//     + 1 - Phi((sqrt(n) |p1 - p2| + z sqrt(2 pbar qbar)) / sqrt(p1 q1 + p2 q2)).
// Unequal arms (ratio = n2 / n1, n = n1 the reference arm's vacancies):
// with pbar = (p1 + ratio p2) / (1 + ratio), the pooled two-proportion z
// test's power (Fleiss, Levin & Paik 2003, Statistical Methods for Rates and
// Proportions, 3rd ed., section 4.4, without continuity correction; from
// memory for the section) is
//     Phi((sqrt(n1) |p1 - p2| - z sqrt(pbar qbar (1 + 1/ratio)))
//         / sqrt(p1 q1 + p2 q2 / ratio)),
// plus the far tail when strict; ratio = 1 is R's formula above. Checked
// against that formula written in R and against simulation of the test.
// R finds n (and p2) with uniroot at tolerance .Machine$double.eps^0.25; here
// n has a closed form (strict = false) or is solved to 1e-12 relative, so R's
// printed n agrees to about 1e-4 absolute (tests/reference/power/ compares
// with R run at a tight tolerance).
#include <optional>

namespace twinprobe::stats {

// Requires n_per_arm > 0 (the reference arm's n1), p1, p2 in [0, 1],
// 0 < alpha < 1, sides 1 or 2, ratio > 0.
double NormalTwoProportionPower(double n_per_arm, double p1, double p2, double alpha, int sides = 2,
                                bool strict = false, double ratio = 1.0);

// The (unrounded) reference-arm n at which power reaches `power` (the other
// arm has ratio times as many). Requires p1 != p2, 0 < power < 1.
double NormalTwoProportionSampleSize(double p1, double p2, double alpha, double power, int sides = 2,
                                     bool strict = false, double ratio = 1.0);

// Minimum detectable p2 for n per arm: the p2 on the chosen side of p1
// (above = true: in (p1, 1), as R does; false: in (0, p1)) at which power
// equals `power`. nullopt when no such p2 exists on that side.
std::optional<double> NormalTwoProportionDetectable(double n_per_arm, double p1, double alpha, double power,
                                                    bool above, int sides = 2, bool strict = false,
                                                    double ratio = 1.0);

}  // namespace twinprobe::stats
