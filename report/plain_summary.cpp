#include "report/plain_summary.h"
#include "report/fieldwork_state.h"
#include "report/plural.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/text_report.h"
#include "report/verdict_sets.h"

namespace twinprobe {
namespace {

std::string Join(const std::vector<std::string>& items, const std::string& last_sep) {
  std::string s;
  for (size_t i = 0; i < items.size(); ++i) {
    if (i > 0) s += (i + 1 == items.size()) ? last_sep : ", ";
    s += items[i];
  }
  return s;
}

// "a coastal", "an inland".
std::string Article(const std::string& word) {
  const bool vowel = !word.empty() && std::string("aeiouAEIOU").find(word[0]) != std::string::npos;
  return (vowel ? "an " : "a ") + word;
}

std::string Alpha(double alpha) {
  std::ostringstream o;
  o << alpha;
  return o.str();
}

// The factor's name for sentences ("gender"), "group" when it has none.
std::string FactorWords(const AnalysisResult& r) {
  std::vector<std::string> factors;
  for (const auto& f : r.design.factors) factors.push_back(f.label.empty() ? f.name : f.label);
  return factors.empty() || (factors.size() == 1 && factors[0] == "arm") ? std::string("group") : Join(factors, " and ");
}

// Applicant records (import applications): real applications, not matched
// fictitious ones, so the sentences say what the data are and what a
// difference in them may reflect.
std::string RecordsWhatWasTested(const AnalysisResult& r) {
  std::ostringstream o;
  std::vector<std::string> arms;
  for (const auto& a : r.arms) arms.push_back(ArmName(r, a.label));
  o << "This study asked whether the outcome of job applications differs by the applicant's " << FactorWords(r)
    << " (" << Join(arms, " or ") << "). The data are the records of "
    << RecordsExtent(r.probes_planned, r.vacancies) << ", each with its recorded outcome.";
  if (r.kind == "unpaired")
    o << " The applicants were real and were not matched: they may differ in qualifications, experience and other "
         "respects that the data do not hold.";
  else
    o << " Each vacancy has one application from each group; the data do not show how alike the applications "
         "were, so a difference may also reflect qualifications the data do not hold.";
  return o.str();
}

std::string RecordsWhatItDoesNotShow(const AnalysisResult& r) {
  std::string s =
      "These are records, not an experiment: a difference in outcome between groups may reflect unequal treatment, "
      "or job-relevant differences between the applicants that the data do not hold, or both. ";
  bool by_vacancy = false;
  for (const auto& a : r.effects.across) by_vacancy = by_vacancy || a.column == "vacancy";
  if (by_vacancy)
    s += "The comparison within vacancies removes differences between vacancies (where and for what people applied), "
         "not differences between the applicants of one vacancy. ";
  s += "The four-fifths rule of the Uniform Guidelines on Employee Selection Procedures (1978, 29 CFR 1607.4(D)) "
       "is a rule of thumb for when a selection-rate ratio deserves attention, not a test; the tests and intervals "
       "above say how far chance could explain the difference.";
  return s;
}

std::string WhatWasTested(const AnalysisResult& r) {
  if (r.records) return RecordsWhatWasTested(r);
  std::ostringstream o;
  std::vector<std::string> factors, arms;
  for (const auto& f : r.design.factors) factors.push_back(f.label.empty() ? f.name : f.label);
  for (const auto& a : r.arms) arms.push_back(ArmName(r, a.label));
  o << "This study asked whether employers answer job applications differently depending on the applicant's "
    << (factors.empty() ? std::string("group") : Join(factors, " and ")) << ". ";
  // "went to" only once every planned application was sent (or carries an
  // imported outcome); before that the study says what is planned and how
  // far the sending has come.
  const bool all_sent = r.flow.sets_sent == r.vacancies;
  if (r.kind == "unpaired") {
    o << "Fictitious applications with equivalent qualifications " << (all_sent ? "went to " : "are planned for ")
      << Count(r.vacancies, "vacancy", "vacancies")
      << ", one application per vacancy, from applicants who differed only in that respect ("
      << Join(arms, " or ") << ").";
  } else {
    o << "Sets of fictitious applications, equal in qualifications and differing only in that respect, "
      << (all_sent ? "went to " : "are planned for ") << Count(r.vacancies, "vacancy", "vacancies")
      << (all_sent ? ": each vacancy received " : ": each vacancy is to receive ");
    if (arms.size() == 2)
      o << "one application from " << Article(arms[0]) << " applicant and one from " << Article(arms[1]) << " applicant.";
    else o << "one application from each group (" << Join(arms, " and ") << ").";
  }
  if (!all_sent && r.probes_sent > 0)
    o << " So far " << Count(r.probes_sent, "application has", "applications have") << " been sent, and "
      << Count(r.flow.sets_sent, "vacancy has", "vacancies have") << " received "
      << (r.kind == "unpaired" ? (r.flow.sets_sent == 1 ? "its application." : "their application.")
                               : (r.flow.sets_sent == 1 ? "every application of its set." : "every application of their set."));
  if (!r.design.first_sent_at.empty())
    o << " Applications were sent "
      << (r.design.first_sent_at.substr(0, 10) == r.design.last_sent_at.substr(0, 10)
              ? "on " + r.design.first_sent_at.substr(0, 10)
              : "between " + r.design.first_sent_at.substr(0, 10) + " and " + r.design.last_sent_at.substr(0, 10))
      << ", and answers were counted for " << r.design.window_days
      << " days after each application.";
  if (r.probes_sent == 0 && r.responses == 0) return o.str();  // nothing sent: no count of sets used or left out
  o << " " << Count(r.sets_analysed, "set was", "sets were") << " complete and analysed";
  if (r.sets_incomplete) o << "; " << r.sets_incomplete << " could not be used because an application was not sent";
  o << ".";
  if (const std::string open = OpenSetsSentence(r); !open.empty()) o << " " << open;
  return o.str();
}

std::string WhatWasFound(const AnalysisResult& r) {
  std::ostringstream o;
  std::vector<std::string> codes;
  for (const auto& c : r.positive_codes) codes.push_back(CodeName(c));
  // "3 of 10 applications from inland applicants (30.0%)", per arm.
  std::vector<std::string> parts;
  for (const auto& a : r.arms)
    parts.push_back(std::to_string(a.positive) + " of " + std::to_string(a.probes) + " applications from " +
                    ArmName(r, a.label) + " applicants (" + FormatPercent(a.rate) + ")");
  if (r.records) {
    o << "A positive outcome is " << Join(codes, " or ") << ". ";
    o << "The outcome was positive for " << Join(parts, " and ") << ".";
    for (size_t i = 0; i < r.impact_vs_highest.size(); ++i) {
      const stats::ImpactRatio& q = r.impact_vs_highest[i];
      if (q.ratio >= 1 || std::isnan(q.ratio)) continue;
      char ratio[32];
      std::snprintf(ratio, sizeof ratio, "%.2f", q.ratio);
      o << " The selection rate of " << ArmName(r, r.arms[i].label) << " applicants was " << ratio
        << " times the highest group's" << (q.below_four_fifths ? ", below four-fifths." : ", not below four-fifths.");
    }
    return o.str();
  }
  o << "A positive answer means " << Join(codes, " or ") << ". ";
  o << "Employers answered positively to " << Join(parts, " and ") << ".";
  if (r.has_paired) {
    const auto& t = r.paired;
    o << " Of the " << Count(t.n(), "pair", "pairs") << ", both applicants were answered positively in " << t.a
      << " and neither in " << t.d << ". In the " << Count(t.discordant(), "pair", "pairs")
      << " where the employer treated the two differently, only the "
      << ArmName(r, r.reference_label) << " applicant was answered positively " << Count(t.b, "time", "times")
      << " and only the " << ArmName(r, r.other_label) << " applicant " << Count(t.c, "time", "times") << ".";
    if (!r.effects.comparisons.empty() && r.effects.comparisons.front().paired) {
      const auto& c = r.effects.comparisons.front();
      const auto& net = c.net.among_positive;
      if (!std::isnan(net.estimate))
        o << " Net discrimination, the share of vacancies with at least one positive answer that favoured "
          << ArmName(r, r.reference_label) << " minus the share that favoured " << ArmName(r, r.other_label) << ", was "
          << FormatPercent(net.estimate) << " (" << std::lround(r.confidence * 100) << "% interval "
          << FormatPercent(net.ci.low) << " to " << FormatPercent(net.ci.high) << ").";
    }
  }
  return o.str();
}

std::string HowSure(const AnalysisResult& r) {
  std::ostringstream o;
  const int conf = static_cast<int>(std::lround(r.confidence * 100));
  if (!r.has_paired && r.records) {
    // Sets keep their pairing (McNemar, in the comparisons below the
    // summary); only independent applications get Fisher's test here.
    for (const ArmComparison& c : r.effects.comparisons) {
      if (c.paired) continue;
      o << "Fisher's exact test, two-sided, " << (c.fisher.p.p < r.alpha ? "rejects" : "does not reject")
        << " equal selection rates of " << ArmName(r, r.arms.front().label) << " and " << ArmName(r, c.other_label)
        << " applicants at the study's threshold of " << Alpha(r.alpha) << " (" << PlainP(c.fisher.p.p) << "). ";
    }
    o << "The " << conf << "% confidence intervals of the selection rates show how high or low each group's rate "
      << "may plausibly be.";
    return o.str();
  }
  if (const std::string sets = SetsHowSure(r); !sets.empty()) return sets;
  if (!r.has_paired) {
    o << "The " << conf
      << "% confidence intervals of the callback rates show how high or low each group's true callback rate may plausibly be.";
    return o.str();
  }
  const auto& t = r.paired;
  if (t.discordant() == 0) {
    o << "No employer treated the two applicants differently, so these data cannot show a difference either way.";
    return o.str();
  }
  o << "If employers had no preference, a split of the " << Count(t.discordant(), "unequal-treatment pair", "unequal-treatment pairs")
    << " at least as "
    << "uneven as " << t.b << " to " << t.c << " would happen by chance with probability "
    << (r.mcnemar_exact_p < 0.001 ? "below one in a thousand" : FormatP(r.mcnemar_exact_p)) << " ("
    << PlainP(r.mcnemar_exact_p) << ", exact McNemar test, two-sided). ";
  if (r.mcnemar_exact_p < r.alpha)
    o << "That is below the study's threshold of " << Alpha(r.alpha)
      << ", so the test rejects equal treatment: chance alone is an unlikely explanation of the "
      << ArmName(r, t.b > t.c ? r.reference_label : r.other_label)
      << " applicants' advantage at these vacancies. ";
  else
    o << "That is not below the study's threshold of " << Alpha(r.alpha)
      << ", so the test does not show a difference. This is not proof that there is none; a larger study may find one. ";
  o << "The " << conf
    << (r.records ? "% confidence intervals of the rates show how high or low each group's true rate may plausibly be."
                  : "% confidence intervals of the callback rates show how high or low each group's true callback rate "
                    "may plausibly be.");
  return o.str();
}

std::string WhatItDoesNotShow() {
  return "A correspondence test measures the first step of hiring (who is answered, invited or asked for more "
         "information) at the vacancies tested. It does not show who would have been hired, why an employer acted "
         "as it did, or how employers outside the sample behave, and a single unequal pair says little about a "
         "single employer. See the cautions at the end of this report.";
}

}  // namespace

std::string RecordsExtent(int64_t applications, int64_t vacancies) {
  return Count(applications, "application", "applications") +
         (vacancies == applications ? std::string() : " in " + Count(vacancies, "vacancy", "vacancies"));
}

std::string PlainP(double p) { return p < 0.001 ? "p < 0.001" : "p = " + FormatP(p); }

std::string CodeName(const std::string& code) {
  std::string s = code;
  for (auto& ch : s)
    if (ch == '_') ch = ' ';
  return s;
}

std::string Headline(const AnalysisResult& r) {
  if (r.listings.listing_only) {
    if (r.listings.overall.empty()) return "Listing audit of " + std::to_string(r.listings.listings) + " ranked lists.";
    const auto& c = r.listings.overall.front();
    return "In " + std::to_string(r.listings.listings) + " ranked lists, " + c.reference + " items " +
           (c.exposure_gap >= 0 ? "received more" : "received less") + " attention than " + c.other +
           " items (permutation test, two-sided, " + PEquals(c.gap_p) + ").";
  }
  if (const std::string early = EarlyStateSentence(r); !early.empty()) return early;
  if (r.sets_analysed == 0 || r.arms.empty()) return "No complete set of applications has been analysed yet.";
  if (const std::string sets = SetsHeadline(r); !sets.empty()) return sets;
  if (!r.has_paired) {
    std::vector<std::string> parts;
    for (const auto& a : r.arms) parts.push_back(ArmName(r, a.label) + " " + FormatPercent(a.rate));
    return std::string(r.records ? "Share of applications with a positive outcome: "
                                 : "Share of applications answered positively: ") +
           Join(parts, " and ") + ".";
  }
  const auto& t = r.paired;
  const ArmResult& ref = r.arms[0];
  const ArmResult& other = r.arms.size() > 1 ? r.arms[1] : r.arms[0];
  auto cap = [](std::string s) {
    if (!s.empty() && s[0] >= 'a' && s[0] <= 'z') s[0] = static_cast<char>(s[0] - 'a' + 'A');
    return s;
  };
  if (t.discordant() == 0)
    return "No employer treated the two applicants differently, so these data show no difference either way.";
  const bool ref_favoured = t.b > t.c;
  const ArmResult& hi = ref_favoured ? ref : other;
  const ArmResult& lo = ref_favoured ? other : ref;
  if (t.b == t.c)
    return "Unequal treatment went both ways equally often (" + std::to_string(t.b) + " pairs each); the data show no "
           "difference.";
  std::string s = cap(ArmName(r, hi.label)) + " applicants received positive answers more often than " + ArmName(r, lo.label) +
                  " applicants (" + FormatPercent(hi.rate) + " against " + FormatPercent(lo.rate) + "); ";
  if (r.mcnemar_exact_p < r.alpha)
    s += "chance alone is an unlikely explanation (" + PlainP(r.mcnemar_exact_p) + ").";
  else
    s += "the difference could well be chance (" + PlainP(r.mcnemar_exact_p) + "), so the test does not show one.";
  return s;
}

std::string ArmName(const std::string& label) { return ArmDisplayText(label, {}); }

std::string ArmName(const AnalysisResult& result, const std::string& label) {
  auto it = result.design.arm_display.find(label);
  return it == result.design.arm_display.end() ? ArmName(label) : it->second;
}

std::string ArmShown(const AnalysisResult& result, const std::string& label) {
  const std::string shown = ArmName(result, label);
  return shown == ArmName(label) ? label : label + " (" + shown + ")";
}

namespace {

// A store with ranked lists only (a listing audit without applications).
std::vector<SummaryParagraph> ListingOnlySummary(const AnalysisResult& r) {
  const ListingAudit& a = r.listings;
  std::ostringstream tested, found;
  std::vector<std::string> factors;
  for (const auto& f : a.factors) factors.push_back(f);
  tested << "This audit asked whether ranked lists place items differently depending on their "
         << (factors.empty() ? std::string("group") : Join(factors, " and ")) << ". It read " << a.listings
         << " ranked lists in " << a.strata << " query and location combinations, " << a.appearances << " places in all.";
  for (const auto& g : a.groups)
    found << g.label << " items held " << g.appearances << " places and received " << FormatPercent(g.exposure_share)
          << " of the attention (exposure). ";
  for (const auto& c : a.overall) {
    char gap[32];
    std::snprintf(gap, sizeof gap, "%+.4f", c.exposure_gap);
    found << "The exposure gap between " << c.reference << " and " << c.other << " items was " << gap
          << " (permutation test, two-sided, " << PEquals(c.gap_p) << "). ";
  }
  return {{"What was tested", tested.str()},
          {"What was found", found.str()},
          {"What this does not show",
           "A listing audit measures where items appeared in the lists read, for the queries and places read, at "
           "the times they were read. It does not show why a list was ordered as it was, nor how other queries, "
           "places or readers would see it."}};
}

}  // namespace

std::vector<SummaryParagraph> PlainSummary(const AnalysisResult& r) {
  if (r.listings.listing_only) return ListingOnlySummary(r);
  if (const std::string early = EarlyStateSentence(r); !early.empty())
    return {{"What was tested", WhatWasTested(r)}, {"Where the study stands", early}};
  return {{"What was tested", WhatWasTested(r)},
          {"What was found", WhatWasFound(r)},
          {"How sure we are", HowSure(r)},
          {"What this does not show", r.records ? RecordsWhatItDoesNotShow(r) : WhatItDoesNotShow()}};
}

}  // namespace twinprobe
