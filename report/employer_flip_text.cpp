#include "report/employer_flip_text.h"

#include <sstream>

#include "report/p_value.h"
#include "report/plural.h"

namespace twinprobe {

std::string EmployerFlipSentence(const AnalysisResult& r) {
  const auto& e = r.employers;
  if (!e.flip_tested) return "";
  const auto& f = e.flip;
  std::ostringstream o;
  o << "The employer sign-flip test (the arms of all pairs of one employer swapped together; "
    << (f.exact ? std::string("exact") : "Monte Carlo, " + Count(f.resamples, "resample", "resamples"))
    << "), two-sided, " << (f.p_two_sided < r.alpha ? "rejects" : "does not reject") << " equal treatment at alpha "
    << r.alpha << ": " << PEquals(f.p_two_sided) << " (sum(b) - sum(c) = " << f.statistic << " over "
    << Count(f.employers, "employer", "employers") << " whose unequal pairs do not cancel; "
    << Count(e.employers_with_several, "employer has", "employers have") << " more than one pair).";
  if (e.flip_disagrees)
    o << " Its decision differs from the pair-level exact McNemar test's (" << PEquals(r.mcnemar_exact_p)
      << "), which counts the pairs of one employer as independent: an employer's preference repeats across its "
         "vacancies, so the employer-level test is the one to read.";
  return o.str();
}

}  // namespace twinprobe
