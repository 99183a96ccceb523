#include "report/json_report.h"

#include <cmath>

#include <nlohmann/json.hpp>

#include "report/design_report.h"
#include "report/effects_report.h"

namespace twinprobe {
namespace {

// JSON has no infinity; the calculators and reports write "Inf".
nlohmann::json Num(double v) {
  if (std::isinf(v)) return v > 0 ? "Inf" : "-Inf";
  if (std::isnan(v)) return nullptr;
  return v;
}

nlohmann::json Table(const stats::PairedCounts& t) {
  return {{"a", t.a}, {"b", t.b}, {"c", t.c}, {"d", t.d}, {"n", t.n()}};
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
                 {"sets_analysed", r.sets_analysed},   {"sets_incomplete", r.sets_incomplete}};
  j["arms"] = nlohmann::json::array();
  for (const auto& a : r.arms)
    j["arms"].push_back({{"label", a.label},
                         {"is_reference", a.is_reference},
                         {"probes", a.probes},
                         {"positive", a.positive},
                         {"rate", Num(a.rate)},
                         {"conf_int", {Num(a.ci.low), Num(a.ci.high)}}});
  if (r.has_paired) {
    nlohmann::json p;
    p["reference_arm"] = r.reference_label;
    p["other_arm"] = r.other_label;
    p["table"] = Table(r.paired);
    p["mcnemar_exact_p"] = Num(r.mcnemar_exact_p);
    p["strata"] = nlohmann::json::array();
    for (const auto& s : r.strata)
      p["strata"].push_back({{"name", s.name}, {"value", s.value}, {"table", Table(s.table)},
                             {"exploratory", r.preregistration.IsExploratoryStratum(s.name)}});
    j["paired"] = p;
  }
  j["effects"] = EffectsJson(r);
  j["balance"] = BalanceJson(r.balance);
  j["preregistration"] = PreregistrationJson(r.preregistration);
  return j.dump(2) + "\n";
}

}  // namespace twinprobe
