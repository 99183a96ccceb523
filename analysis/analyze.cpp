#include "analysis/analyze.h"

#include <map>
#include <set>

#include "core/meta.h"

namespace twinprobe {
namespace {

struct ProbeRow {
  int64_t vacancy_id = 0;
  int64_t arm_id = 0;
  bool sent = false;
  bool has_response = false;
  bool positive = false;
};

}  // namespace

Result<AnalysisResult> Analyze(Store& store, const OutcomeScheme& scheme, const AnalysisPlan& plan) {
  AnalysisResult r;
  Stmt p = store.Prepare("SELECT id, kind, origin FROM current_plan");
  if (!p.Step()) {
    // A listing audit needs no plan: `import ranks` alone makes a store.
    auto listings = AnalyzeStudyListings(store, plan);
    if (!listings.ok()) return listings.error();
    if (!listings.value().present)
      return BadInput(store.path(), "the store holds no plan yet", "run 'twinprobe plan' or 'twinprobe import pairs' first");
    r.kind = "listing";
    r.plan_origin = "import";
    r.title = MetaValue(store, "title").value_or("Listing audit");
    r.alpha = plan.alpha;
    r.confidence = 1.0 - plan.alpha;
    r.correction = plan.correction;
    r.listings = listings.value();
    r.listings.listing_only = true;
    return r;
  }
  const int64_t plan_id = p.Int(0);
  r.kind = p.Text(1);
  r.plan_origin = p.Text(2);
  r.study_id = MetaValue(store, "study_id").value_or("");
  r.title = MetaValue(store, "title").value_or(r.study_id);
  r.alpha = plan.alpha;
  r.confidence = 1.0 - plan.alpha;
  r.correction = plan.correction;
  r.positive_codes = scheme.positive;

  // Arms, reference first.
  std::vector<std::pair<int64_t, ArmResult>> arms;
  Stmt a = store.Prepare("SELECT id, label, is_reference FROM arm WHERE plan_id = ?1 ORDER BY is_reference DESC, id");
  a.Bind(1, plan_id);
  while (a.Step()) {
    ArmResult ar;
    ar.label = a.Text(1);
    ar.is_reference = a.Int(2) != 0;
    arms.emplace_back(a.Int(0), ar);
  }

  r.vacancies = store.QueryInt("SELECT count(*) FROM vacancy WHERE plan_id = (SELECT max(id) FROM plan)");
  r.responses_superseded = store.QueryInt(
      "SELECT count(*) FROM response r JOIN current_probe p ON p.id = r.probe_id WHERE r.supersedes IS NOT NULL");

  // Every probe with its sending state and current outcome, in one pass.
  Stmt q = store.Prepare(
      "SELECT p.vacancy_id, p.arm_id, "
      "  EXISTS (SELECT 1 FROM sending s WHERE s.probe_id = p.id), "
      "  (SELECT code FROM current_response r WHERE r.probe_id = p.id ORDER BY r.id DESC LIMIT 1) "
      "FROM current_probe p ORDER BY p.vacancy_id, p.id");
  std::map<int64_t, std::vector<ProbeRow>> sets;
  while (q.Step()) {
    ProbeRow row;
    row.vacancy_id = q.Int(0);
    row.arm_id = q.Int(1);
    row.sent = q.Int(2) != 0;
    row.has_response = !q.IsNull(3);
    row.positive = row.has_response && scheme.is_positive(q.Text(3));
    ++r.probes_planned;
    if (row.sent) ++r.probes_sent;
    if (row.has_response) ++r.responses;
    sets[row.vacancy_id].push_back(row);
  }

  // Strata of each vacancy.
  std::map<int64_t, std::vector<std::pair<std::string, std::string>>> strata_of;
  Stmt s = store.Prepare(
      "SELECT vs.vacancy_id, vs.name, vs.value FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id "
      "WHERE v.plan_id = ?1 ORDER BY vs.name, vs.value");
  s.Bind(1, plan_id);
  while (s.Step()) strata_of[s.Int(0)].emplace_back(s.Text(1), s.Text(2));

  const bool paired = arms.size() == 2 && r.kind != "unpaired";
  std::map<std::pair<std::string, std::string>, stats::PairedCounts> by_stratum;
  std::map<int64_t, stats::PairedCounts> pair_of_vacancy;  // for SummariseEmployers
  for (const auto& [vacancy, probes] : sets) {
    bool complete = true;
    for (const auto& pr : probes) complete = complete && (pr.sent || pr.has_response);
    if (!complete) {
      ++r.sets_incomplete;
      continue;
    }
    ++r.sets_analysed;
    for (const auto& pr : probes)
      for (auto& [id, ar] : arms)
        if (id == pr.arm_id) {
          ++ar.probes;
          if (pr.positive) ++ar.positive;
        }
    if (paired && probes.size() == 2) {
      bool ref_pos = false, other_pos = false;
      for (const auto& pr : probes) (pr.arm_id == arms[0].first ? ref_pos : other_pos) = pr.positive;
      stats::PairedCounts one;
      (ref_pos ? (other_pos ? one.a : one.b) : (other_pos ? one.c : one.d)) = 1;
      auto add = [](stats::PairedCounts& t, const stats::PairedCounts& x) {
        t.a += x.a, t.b += x.b, t.c += x.c, t.d += x.d;
      };
      add(r.paired, one);
      pair_of_vacancy[vacancy] = one;
      for (const auto& kv : strata_of[vacancy]) add(by_stratum[kv], one);
    }
  }
  for (auto& [id, ar] : arms) {
    ar.rate = ar.probes ? static_cast<double>(ar.positive) / static_cast<double>(ar.probes) : 0.0;
    if (ar.probes) ar.ci = stats::ClopperPearson(ar.positive, ar.probes, r.confidence);
    r.arms.push_back(ar);
  }
  if (paired) {
    r.has_paired = true;
    r.reference_label = arms[0].second.label;
    r.other_label = arms[1].second.label;
    r.mcnemar_exact_p = stats::McNemarExactP(r.paired);
    for (const auto& [key, table] : by_stratum) r.strata.push_back({key.first, key.second, table});
  }
  auto listings = AnalyzeStudyListings(store, plan);
  if (!listings.ok()) return listings.error();
  r.listings = listings.value();
  // Effects of every arm against the reference, on the complete sets.
  EffectsInput effects_in;
  effects_in.kind = r.kind;
  effects_in.confidence = r.confidence;
  effects_in.correction = r.correction;
  std::map<int64_t, int> arm_index;
  for (const auto& [id, ar] : arms) {
    arm_index[id] = static_cast<int>(effects_in.arm_labels.size());
    effects_in.arm_labels.push_back(ar.label);
  }
  for (const auto& [vacancy, probes] : sets) {
    SetOutcome so;
    bool complete = true;
    for (const auto& pr : probes) {
      complete = complete && (pr.sent || pr.has_response);
      so.probes.emplace_back(arm_index[pr.arm_id], pr.positive);
    }
    if (!complete) continue;
    so.strata = strata_of[vacancy];
    effects_in.sets.push_back(std::move(so));
  }
  r.effects = ComputeEffects(effects_in);
  r.design = SummariseDesign(store);
  r.response_times = ComputeResponseTimes(store, scheme);
  r.employers = SummariseEmployers(store, pair_of_vacancy);
  return r;
}

}  // namespace twinprobe
