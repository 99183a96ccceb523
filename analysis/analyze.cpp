#include "analysis/analyze.h"

#include <algorithm>
#include <map>

#include "analysis/listing_reference.h"

namespace twinprobe {
namespace {

// The k-level analysis reads the same complete sets as the effects; scores
// come from the design file in use (the store keeps levels, not scores).
KLevelInput KLevelInputFor(const EffectsInput& e, const StoredDesign& stored, const Design* current_design) {
  KLevelInput in;
  in.kind = e.kind;
  in.arm_labels = e.arm_labels;
  in.sets = e.sets;
  in.correction = e.correction;
  in.confidence = e.confidence;
  for (const StoredFactor& sf : stored.factors) {
    // Scores as stored with the levels (plan, or import applications
    // --scores); the study.toml in use, when it has them, as before.
    KLevelFactor f{sf.name, sf.levels, sf.reference.empty() && !sf.levels.empty() ? sf.levels[0] : sf.reference,
                   sf.scores, sf.DisplayName(), {}};
    for (const std::string& level : sf.levels) f.level_labels.push_back(sf.LevelLabel(level));
    if (current_design)
      for (const Factor& df : current_design->factors)
        if (df.name == sf.name && df.levels == sf.levels) f.scores = df.scores;
    in.factors.push_back(std::move(f));
  }
  return in;
}

// The complete sets with each probe's template and send position (the
// layout lists a vacancy's probes in the order of its SetProbe list).
std::vector<std::vector<LaidOutProbe>> LaidOutSets(const Fieldwork& f, const ProbeLayouts& layout) {
  std::vector<std::vector<LaidOutProbe>> sets;
  for (const CompletedSet& c : f.completed) {
    auto it = layout.find(c.vacancy_id);
    if (it == layout.end() || it->second.size() != c.probes.size()) continue;
    std::vector<LaidOutProbe> set;
    for (size_t i = 0; i < c.probes.size(); ++i)
      set.push_back({c.probes[i].arm, c.probes[i].positive, it->second[i].template_path, it->second[i].send_order});
    sets.push_back(std::move(set));
  }
  return sets;
}

void AddPair(stats::PairedCounts& t, bool ref_pos, bool other_pos, int64_t n) {
  (ref_pos ? (other_pos ? t.a : t.b) : (other_pos ? t.c : t.d)) += n;
}

}  // namespace

Result<AnalysisResult> Analyze(const StudyReading& reading, const std::string& store_path, const OutcomeScheme& scheme,
                               const AnalysisPlan& plan, const Design* current_design) {
  const Fieldwork& f = reading.fieldwork;
  const StoredDesign& stored = reading.design;
  AnalysisResult r;
  r.alpha = plan.alpha;
  r.confidence = 1.0 - plan.alpha;
  r.correction = plan.correction;
  if (!f.has_plan) {
    // A listing audit needs no plan: `import ranks` alone makes a store.
    auto listings = AnalyzeStudyListings(WithListingReference(reading.listings, current_design), plan, std::nullopt);
    if (!listings.ok()) return listings.error();
    if (!listings.value().present)
      return BadInput(store_path, "the store holds no plan yet", "run 'twinprobe plan' or 'twinprobe import pairs' first");
    r.kind = "listing";
    r.plan_origin = "import";
    r.title = stored.title.empty() ? "Listing audit" : stored.title;
    r.listings = listings.value();
    r.listings.listing_only = true;
    r.preregistration = CheckPreregistration(reading.freeze, stored, f, current_design, plan, reading.monitor_looks);
    return r;
  }
  r.kind = f.kind;
  r.plan_origin = f.plan_origin;
  r.records = stored.records;
  r.study_id = stored.study_id;
  r.title = stored.title.empty() ? r.study_id : stored.title;
  r.positive_codes = scheme.positive;
  r.vacancies = f.vacancies;
  r.probes_planned = f.probes_planned;
  r.probes_sent = f.probes_sent;
  r.responses = f.responses;
  r.responses_superseded = f.responses_superseded;
  r.sets_analysed = f.sets_complete;
  r.sets_incomplete = f.sets_incomplete;
  r.sets_open = f.sets_open;
  r.responses_late = f.responses_late;
  r.flow = ComputeFlow(f, scheme.window_days);

  for (const auto& a : f.arms) {
    ArmResult ar;
    ar.label = a.label;
    ar.is_reference = a.is_reference;
    r.arms.push_back(ar);
  }
  const bool paired = f.arms.size() == 2 && r.kind != "unpaired";
  std::map<std::pair<std::string, std::string>, stats::PairedCounts> by_stratum;
  EffectsInput effects_in;
  effects_in.kind = r.kind;
  effects_in.confidence = r.confidence;
  effects_in.correction = r.correction;
  effects_in.alpha = r.alpha;
  effects_in.equivalence_margin = plan.equivalence_margin;
  for (const auto& a : f.arms) effects_in.arm_labels.push_back(a.label);
  for (const StoredFactor& sf : stored.factors)
    if (sf.between) effects_in.between_factors.push_back(sf.name);
  for (const SetShape& s : f.sets) {
    if (!s.complete) continue;
    SetOutcome so;
    so.strata = s.strata;
    so.count = s.count;
    for (const SetProbe& p : s.probes) {
      ArmResult& ar = r.arms[static_cast<size_t>(p.arm)];
      ar.probes += s.count;
      if (p.positive) ar.positive += s.count;
      so.probes.emplace_back(p.arm, p.positive);
    }
    effects_in.sets.push_back(std::move(so));
    if (paired && s.probes.size() == 2) {
      bool ref_pos = false, other_pos = false;
      for (const SetProbe& p : s.probes) (p.arm == 0 ? ref_pos : other_pos) = p.positive;
      AddPair(r.paired, ref_pos, other_pos, s.count);
      for (const auto& kv : s.strata) AddPair(by_stratum[kv], ref_pos, other_pos, s.count);
    }
  }
  for (ArmResult& ar : r.arms) {
    ar.rate = ar.probes ? static_cast<double>(ar.positive) / static_cast<double>(ar.probes) : 0.0;
    if (ar.probes) ar.ci = stats::ClopperPearson(ar.positive, ar.probes, r.confidence);
  }
  if (r.kind == "unpaired" && r.arms.size() >= 2) {
    std::vector<int64_t> positives, totals;
    bool any_positive = false, all_present = true;
    for (const ArmResult& ar : r.arms) {
      positives.push_back(ar.positive);
      totals.push_back(ar.probes);
      any_positive = any_positive || ar.positive > 0;
      all_present = all_present && ar.probes > 0;
    }
    if (any_positive && all_present)
      r.impact_vs_highest = stats::ImpactRatios(positives, totals, stats::kHighestRate, r.confidence);
  }
  if (paired) {
    r.has_paired = true;
    r.reference_label = f.arms[0].label;
    r.other_label = f.arms[1].label;
    r.mcnemar_exact_p = stats::McNemarExactP(r.paired);
    for (const auto& [key, table] : by_stratum) r.strata.push_back({key.first, key.second, table});
  }
  auto listings = AnalyzeStudyListings(reading.listings, plan, f.seed);
  if (!listings.ok()) return listings.error();
  r.listings = listings.value();
  r.effects = ComputeEffects(effects_in);
  // The paired table by stratum follows the same rule: no one-row table for a column with one value.
  std::erase_if(r.strata, [&](const StratumTable& t) {
    return std::any_of(r.effects.single_strata.begin(), r.effects.single_strata.end(),
                       [&](const SingleStratum& one) { return one.column == t.name; });
  });
  r.stages = ComputeHiringStages(stored.stages, effects_in.arm_labels, reading.code_counts, r.correction, r.confidence);
  KLevelInput k_in = KLevelInputFor(effects_in, stored, current_design);
  k_in.seed = static_cast<uint64_t>(f.seed.value_or(0));
  r.k_levels = AnalyzeKLevels(k_in);
  if (r.kind != "unpaired") {
    r.adjusted = FitAdjustedModel(LaidOutSets(f, reading.layout), effects_in.arm_labels, r.confidence);
    // With a factor varied between vacancies, the arms of one between level
    // fill every set they are in, so their terms are dependent by design (not
    // because of the data): say so rather than blame the data.
    if (!r.adjusted.failure.empty() && !effects_in.between_factors.empty())
      r.adjusted.failure =
          "its arm terms cannot be estimated in this design: a factor varied between vacancies puts the same arms "
          "in every set of a level, so within sets their terms are dependent; the factor sections give each "
          "factor's tests";
  }
  r.covariate_model = FitCovariateModel(reading.covariates, effects_in.arm_labels, scheme, r.confidence);
  r.design = SummariseDesign(f, stored);
  r.response_times = ComputeResponseTimes(f, scheme);
  // Applicant records are real applications: nothing to decline.
  if (!r.records) r.declines = CountDeclines(reading.declines, scheme, f.study_clock);
  r.employers = paired ? SummariseEmployers(f.employers) : EmployerOutcomes{};
  if (r.kind == "sets") r.employer_sets = SummariseEmployerSets(f.employers, f.arms.size());
  TestByEmployer(r.employers, static_cast<uint64_t>(f.seed.value_or(0)), r.mcnemar_exact_p, r.alpha);
  // Records were not assigned to groups by a plan: there is no design
  // balance to check.
  if (!r.records) r.balance = ComputeBalance(f);
  r.preregistration = CheckPreregistration(reading.freeze, stored, f, current_design, plan, reading.monitor_looks);
  if (r.has_paired) r.early_stop = ComputeEarlyStop(reading.monitor_looks);
  return r;
}

}  // namespace twinprobe
