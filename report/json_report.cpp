#include "report/fieldwork_state.h"
#include "report/json_report.h"

#include <cmath>

#include <nlohmann/json.hpp>

#include "report/design_report.h"
#include "report/early_stop_report.h"
#include "report/effects_report.h"
#include "report/declines_report.h"
#include "report/stages_report.h"
#include "report/adjusted_model_report.h"
#include "report/covariate_model_report.h"
#include "report/k_level_report.h"
#include "report/plain_summary.h"
#include "report/json_number.h"

namespace twinprobe {
namespace {

nlohmann::json Table(const stats::PairedCounts& t) {
  return {{"a", t.a}, {"b", t.b}, {"c", t.c}, {"d", t.d}, {"n", t.n()}};
}

nlohmann::json OptNum(const std::optional<double>& v) { return v ? JsonNumber(*v) : nlohmann::json(nullptr); }

nlohmann::json ListingComparisonJson(const ListingComparison& c) {
  return {{"factor", c.factor},
          {"reference", c.reference},
          {"other", c.other},
          {"query", c.query},
          {"location", c.location},
          {"n_reference", c.n_reference},
          {"n_other", c.n_other},
          {"exposure_gap", JsonNumber(c.exposure_gap)},
          {"emd", JsonNumber(c.emd)},
          {"mann_whitney_p", JsonNumber(c.mann_whitney_p)},
          {"exposure_gap_p", JsonNumber(c.gap_p)},
          {"emd_p", JsonNumber(c.emd_p)},
          {"exposure_gap_p_adjusted", OptNum(c.gap_p_adjusted)},
          {"emd_p_adjusted", OptNum(c.emd_p_adjusted)}};
}

// The listing audit (docs/ranks.md lists the keys).
nlohmann::json ListingAuditJson(const ListingAudit& a) {
  nlohmann::json j;
  j["listings"] = a.listings;
  j["appearances"] = a.appearances;
  j["labelled_appearances"] = a.labelled_appearances;
  j["items"] = a.items;
  j["strata"] = a.strata;
  j["factors"] = nlohmann::json::array();
  for (size_t f = 0; f < a.factors.size(); ++f)
    j["factors"].push_back({{"name", a.factors[f]}, {"levels", a.levels[f]}, {"reference", a.levels[f].front()}});
  j["discount"] = a.discount;
  j["top_k"] = a.top_k;
  j["resamples"] = a.resamples;
  j["seed"] = a.seed;
  j["correction"] = a.correction;
  j["groups"] = nlohmann::json::array();
  for (const auto& g : a.groups)
    j["groups"].push_back({{"factor", g.factor},
                           {"group", g.label},
                           {"appearances", g.appearances},
                           {"exposure", JsonNumber(g.exposure)},
                           {"exposure_share", JsonNumber(g.exposure_share)},
                           {"top_k_share", JsonNumber(g.top_k_share)},
                           {"mean_position", JsonNumber(g.mean_position)},
                           {"median_position", JsonNumber(g.median_position)}});
  j["comparisons"] = nlohmann::json::array();
  for (const auto& c : a.overall) j["comparisons"].push_back(ListingComparisonJson(c));
  j["by_stratum"] = nlohmann::json::array();
  for (const auto& c : a.by_stratum) j["by_stratum"].push_back(ListingComparisonJson(c));
  j["paired_across_strata"] = nlohmann::json::array();
  for (const auto& p : a.paired)
    j["paired_across_strata"].push_back(
        {{"factor", p.factor},
         {"reference", p.reference},
         {"other", p.other},
         {"strata", p.strata},
         {"wilcoxon",
          {{"statistic", p.wilcoxon.statistic}, {"p_value", JsonNumber(p.wilcoxon.p_value)}, {"estimate", JsonNumber(p.wilcoxon.estimate)},
           {"exact", p.wilcoxon.exact}}},
         {"sign_test",
          {{"positive", p.sign.positive}, {"negative", p.sign.negative}, {"zeros", p.sign.zeros}, {"p_value", JsonNumber(p.sign.p_value)}}}});
  j["disparity"] = nlohmann::json::array();
  for (const auto& d : a.disparity) {
    nlohmann::json most = nlohmann::json::array(), least = nlohmann::json::array();
    for (const auto& e : d.most) most.push_back({{"value", e.value}, {"disparity", JsonNumber(e.disparity)}});
    for (const auto& e : d.least) least.push_back({{"value", e.value}, {"disparity", JsonNumber(e.disparity)}});
    j["disparity"].push_back({{"dimension", d.dimension}, {"most", most}, {"least", least}});
  }
  if (a.widest)
    j["widest_split"] = {{"split", a.widest->description}, {"parts", a.widest->parts},
                         {"distance", JsonNumber(a.widest->distance)}, {"p_value", JsonNumber(a.widest->p_value)},
                         {"resamples", a.widest->resamples}, {"candidates", a.widest->candidates},
                         {"exhaustive", a.widest->exhaustive}};
  else
    j["widest_split"] = nullptr;
  j["overlap"] = nlohmann::json::array();
  for (const auto& o : a.overlap)
    j["overlap"].push_back({{"profile_a", o.profile_a}, {"profile_b", o.profile_b}, {"comparisons", o.comparisons},
                            {"mean_jaccard_distance", JsonNumber(o.mean_jaccard_distance)}});
  return j;
}

nlohmann::json Milestones(const std::vector<ResponseMilestone>& days) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& m : days)
    out.push_back({{"day", m.day},
                   {"any", m.any},
                   {"any_share", JsonNumber(m.any_share)},
                   {"positive", m.positive},
                   {"positive_share", JsonNumber(m.positive_share)}});
  return out;
}

nlohmann::json DesignJson(const DesignSummary& d) {
  nlohmann::json j;
  j["design_sha256"] = d.design_sha256.empty() ? nlohmann::json(nullptr) : nlohmann::json(d.design_sha256);
  j["seed"] = d.has_seed ? nlohmann::json(d.seed) : nlohmann::json(nullptr);
  // plan_created_at stays out: the plain document must repeat byte for byte
  // for the same data (the demo's reproducibility check); the audit chain
  // keeps the time.
  j["window_days"] = d.window_days;
  j["factors"] = nlohmann::json::array();
  for (const auto& f : d.factors) {
    // Display texts beside the codes (as `check --json` writes them).
    nlohmann::json level_labels = nlohmann::json::object();
    for (size_t i = 0; i < f.levels.size(); ++i)
      level_labels[f.levels[i]] = i < f.level_labels.size() && !f.level_labels[i].empty() ? f.level_labels[i] : f.levels[i];
    j["factors"].push_back({{"name", f.name}, {"label", f.label.empty() ? f.name : f.label}, {"levels", f.levels},
                            {"level_labels", level_labels}, {"reference", f.reference}});
  }
  j["arms"] = nlohmann::json::array();
  for (const auto& a : d.arms)
    j["arms"].push_back({{"label", a.label}, {"display_label", d.arm_display.count(a.label) ? d.arm_display.at(a.label) : a.label},
                         {"is_reference", a.is_reference}, {"profiles", a.profiles},
                         {"probes_planned", a.probes_planned}});
  j["strata_columns"] = d.strata_columns;
  j["strata"] = nlohmann::json::array();
  for (const auto& s : d.strata) j["strata"].push_back({{"name", s.name}, {"value", s.value}, {"vacancies", s.vacancies}});
  j["templates"] = d.templates;
  j["employers"] = d.employers;
  j["first_sent_at"] = d.first_sent_at;
  j["last_sent_at"] = d.last_sent_at;
  return j;
}

nlohmann::json ResponseTimesJson(const ResponseTimes& rt) {
  nlohmann::json j;
  j["available"] = rt.available;
  j["window_days"] = rt.window_days;
  j["arms"] = nlohmann::json::array();
  for (const auto& a : rt.arms) {
    nlohmann::json arm = {{"label", a.label},
                          {"is_reference", a.is_reference},
                          {"probes_sent", a.probes_sent},
                          {"responded", a.responded},
                          {"responded_positive", a.responded_positive},
                          {"late", a.late},
                          {"responses_without_time", a.responses_without_time},
                          {"median_days", a.median_days >= 0 ? JsonNumber(a.median_days) : nlohmann::json(nullptr)}};
    // The curves go out read at each whole day of the window (`by_day`), not
    // as one step per distinct response time: imported times to the second
    // made that about 500,000 steps an arm and a 430 MB document in memory.
    // Each probe's exact times are in `export` (sendings.csv, responses.csv).
    arm["milestones"] = Milestones(a.milestones);
    arm["by_day"] = Milestones(a.by_day);
    arm["codes"] = nlohmann::json::object();
    for (const auto& c : a.codes) arm["codes"][c.code] = c.probes;
    j["arms"].push_back(arm);
  }
  return j;
}

nlohmann::json EmployersJson(const EmployerOutcomes& e) {
  nlohmann::json j;
  j["available"] = e.available;
  j["employers"] = e.employers;
  j["employers_discordant"] = e.employers_discordant;
  if (e.flip_tested)
    j["sign_flip_test"] = {{"test", "employer sign-flip, two-sided"},
                           {"statistic", e.flip.statistic},
                           {"employers", e.flip.employers},
                           {"employers_with_several_pairs", e.employers_with_several},
                           {"p_two_sided", JsonNumber(e.flip.p_two_sided)},
                           {"p_greater", JsonNumber(e.flip.p_greater)},
                           {"p_less", JsonNumber(e.flip.p_less)},
                           {"exact", e.flip.exact},
                           {"resamples", e.flip.resamples},
                           {"differs_from_pair_level_test", e.flip_disagrees}};
  j["discordant"] = nlohmann::json::array();
  for (const auto& x : e.discordant) {
    j["discordant"].push_back(
        {{"pseudonym", x.pseudonym}, {"pairs", x.vacancies}, {"discordant", x.discordant}, {"table", Table(x.table)}});
  }
  return j;
}

}  // namespace

std::string RenderJsonReport(const AnalysisResult& r) {
  nlohmann::json j;
  j["study_id"] = r.study_id;
  j["title"] = r.title;
  j["kind"] = r.kind;
  j["plan_origin"] = r.plan_origin;
  j["alpha"] = r.alpha;
  j["confidence"] = r.confidence;
  j["correction"] = r.correction;
  j["positive_codes"] = r.positive_codes;
  j["counts"] = {{"vacancies", r.vacancies},           {"probes_planned", r.probes_planned},
                 {"probes_sent", r.probes_sent},       {"responses", r.responses},
                 {"responses_superseded", r.responses_superseded},
                 {"sets_analysed", r.sets_analysed},   {"sets_incomplete", r.sets_incomplete},
                 {"sets_open", r.sets_open},           {"responses_late", r.responses_late}};
  // Where the fieldwork stands, in the words of the text report (report/fieldwork_state.h).
  {
    nlohmann::json flow = {{"vacancies_planned", r.flow.vacancies_planned}, {"sets_sent", r.flow.sets_sent},
                           {"sets_closed", r.flow.sets_closed},             {"sets_analysed", r.flow.sets_analysed},
                           {"window_days", r.flow.window_days},             {"probes_open", r.flow.probes_open},
                           {"responses_late", r.flow.responses_late}};
    flow["excluded"] = nlohmann::json::array();
    for (const auto& x : r.flow.exclusions)
      flow["excluded"].push_back({{"reason", x.reason}, {"label", x.label}, {"sets", x.sets}});
    j["flow"] = flow;
    const std::string open = OpenSetsSentence(r), early = EarlyStateSentence(r);
    j["open_sets"] = open.empty() ? nlohmann::json(nullptr) : nlohmann::json(open);
    j["early_state"] = early.empty() ? nlohmann::json(nullptr) : nlohmann::json(early);
  }
  j["arms"] = nlohmann::json::array();
  for (const auto& a : r.arms)
    j["arms"].push_back({{"label", a.label},
                         {"display_label", ArmName(r, a.label)},
                         {"is_reference", a.is_reference},
                         {"probes", a.probes},
                         {"positive", a.positive},
                         // No rate without an analysed application (never a 0.0% from 0 of 0).
                         {"rate", a.probes ? JsonNumber(a.rate) : nlohmann::json(nullptr)},
                         {"conf_int", {JsonNumber(a.ci.low), JsonNumber(a.ci.high)}}});
  if (r.has_paired) {
    nlohmann::json p;
    p["reference_arm"] = r.reference_label;
    p["other_arm"] = r.other_label;
    p["reference_arm_label"] = ArmName(r, r.reference_label);
    p["other_arm_label"] = ArmName(r, r.other_label);
    p["table"] = Table(r.paired);
    p["mcnemar_exact_p"] = JsonNumber(r.mcnemar_exact_p);
    p["strata"] = nlohmann::json::array();
    for (const auto& s : r.strata)
      p["strata"].push_back({{"name", s.name}, {"value", s.value}, {"table", Table(s.table)},
                             {"exploratory", r.preregistration.IsExploratoryStratum(s.name)}});
    j["paired"] = p;
  }
  j["effects"] = EffectsJson(r);
  if (r.stages.present) j["stages"] = StagesJson(r.stages);
  if (r.declines.present) j["declines"] = DeclinesJson(r.declines);
  if (r.k_levels.present) j["k_levels"] = KLevelJson(r.k_levels);
  if (r.adjusted.present) j["adjusted_model"] = AdjustedJson(r.adjusted);
  if (r.covariate_model.present) j["covariate_model"] = CovariateModelJson(r.covariate_model);
  if (r.employer_sets.available) {
    nlohmann::json rows = nlohmann::json::array();
    for (const EmployerSetRow& e : r.employer_sets.unequal_rows)
      rows.push_back({{"pseudonym", e.pseudonym}, {"sets", e.sets}, {"unequal", e.unequal}, {"positive", e.positive}});
    j["employer_sets"] = {{"employers", r.employer_sets.employers},
                          {"employers_unequal", r.employer_sets.employers_unequal},
                          {"unequal", rows}};
  }
  j["design"] = DesignJson(r.design);
  j["response_times"] = ResponseTimesJson(r.response_times);
  j["employers"] = EmployersJson(r.employers);
  j["balance"] = BalanceJson(r.balance);
  j["preregistration"] = PreregistrationJson(r.preregistration);
  j["early_stop"] = EarlyStopJson(r.early_stop);
  if (r.listings.present) j["listing_audit"] = ListingAuditJson(r.listings);
  return j.dump(2) + "\n";
}

std::string RenderJsonReport(const AnalysisResult& r, const ReportContext& ctx) {
  // The context adds to the plain document; the plain one stays the single
  // place where result fields become keys.
  nlohmann::json j = nlohmann::json::parse(RenderJsonReport(r));
  j["report"] = {{"tool_version", ctx.tool_version},
                 {"generated_at", ctx.generated_at},
                 {"audit_head", ctx.audit_head},
                 {"audit_entries", ctx.audit_entries},
                 {"audit_intact", ctx.audit_intact},
                 {"employers_revealed", ctx.reveal_employers}};
  if (ctx.reveal_employers)
    for (auto& row : j["employers"]["discordant"]) {
      auto it = ctx.employer_names.find(row["pseudonym"].get<std::string>());
      row["name"] = it == ctx.employer_names.end() ? nlohmann::json(nullptr) : nlohmann::json(it->second);
    }
  return j.dump(2) + "\n";
}

}  // namespace twinprobe
