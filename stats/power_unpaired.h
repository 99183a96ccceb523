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
// R finds n (and p2) with uniroot at tolerance .Machine$double.eps^0.25; here
// n has a closed form (strict = false) or is solved to 1e-12 relative, so R's
// printed n agrees to about 1e-4 absolute (tests/reference/power/ compares
// with R run at a tight tolerance).
#include <optional>

namespace twinprobe::stats {

// Requires n_per_arm > 0, p1, p2 in [0, 1], 0 < alpha < 1, sides 1 or 2.
double NormalTwoProportionPower(double n_per_arm, double p1, double p2, double alpha, int sides = 2,
                                bool strict = false);

// The (unrounded) n per arm at which power reaches `power`. Requires p1 != p2,
// 0 < power < 1.
double NormalTwoProportionSampleSize(double p1, double p2, double alpha, double power, int sides = 2,
                                     bool strict = false);

// Minimum detectable p2 for n per arm: the p2 on the chosen side of p1
// (above = true: in (p1, 1), as R does; false: in (0, p1)) at which power
// equals `power`. nullopt when no such p2 exists on that side.
std::optional<double> NormalTwoProportionDetectable(double n_per_arm, double p1, double alpha, double power,
                                                    bool above, int sides = 2, bool strict = false);

}  // namespace twinprobe::stats
