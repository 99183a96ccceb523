#include "core/plan_header.h"

#include <map>
#include <optional>

#include "core/clock.h"
#include "core/factor_signal.h"
#include "core/sha256.h"
#include "core/store.h"

namespace twinprobe {

int64_t StorePlanHeader(Store& store, int64_t seq, const std::string& origin, const Design& design,
                        std::vector<int64_t>& arm_ids) {
  std::optional<PlanOrigin> parsed = ParsePlanOrigin(origin);
  if (!parsed) throw StoreError("plan origin '" + origin + "' is not a stored origin (plan, import)");
  return StorePlanHeader(store, seq, *parsed, design, arm_ids);
}

int64_t StorePlanHeader(Store& store, int64_t seq, PlanOrigin origin, const Design& design,
                        std::vector<int64_t>& arm_ids) {
  // Design::kind is still text (the design file reads it); the store keeps
  // only spellings of DesignKind.
  std::optional<DesignKind> kind = ParseDesignKind(design.kind);
  if (!kind) throw StoreError("design kind '" + design.kind + "' is not a stored design kind");
  Stmt ins_plan = store.Prepare(
      "INSERT INTO plan(origin, kind, design_sha256, seed, created_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins_plan.Bind(1, PlanOriginName(origin)).Bind(2, DesignKindName(*kind));
  if (design.canonical.empty()) ins_plan.BindNull(3);
  else ins_plan.Bind(3, Sha256Hex(design.canonical));
  ins_plan.Bind(4, static_cast<int64_t>(design.seed)).Bind(5, NowIso()).Bind(6, seq).Run();
  int64_t plan_id = store.LastInsertId();

  // The store must be readable without the design file (analysis of an
  // imported study, or after the design is lost), so it keeps what analysis
  // needs to know in meta.
  auto join = [](const std::vector<std::string>& v) {
    std::string s;
    for (const auto& x : v) s += (s.empty() ? "" : ",") + x;
    return s;
  };
  Stmt ins_meta = store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES (?1, ?2, ?3)");
  for (const auto& [k, v] : std::vector<std::pair<std::string, std::string>>{
           {"study_id", design.study_id},
           {"title", design.title},
           {"outcomes.codes", join(design.outcomes.codes)},
           {"outcomes.positive", join(design.outcomes.positive)},
           {"outcomes.window_days", std::to_string(design.outcomes.window_days)},
           {"strata", join(design.strata)},
           {"ethics.retention_days", std::to_string(design.ethics.retention_days)},
           {"ethics.decline_within_hours", std::to_string(design.ethics.decline_within_hours)}})
    ins_meta.Bind(1, k).Bind(2, v).Bind(3, seq).Run();

  std::map<std::pair<std::string, std::string>, int64_t> level_ids;
  Stmt ins_factor = store.Prepare("INSERT INTO factor(plan_id, name, audit_seq) VALUES (?1, ?2, ?3)");
  Stmt ins_level = store.Prepare(
      "INSERT INTO level(factor_id, name, is_reference, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  // How a factor varies, its labels, scores and signal: a row only when
  // something differs from what a store without these tables means (varied
  // within, signalled by the name alone, no label or score), so plain
  // designs store exactly the rows they always did.
  Stmt ins_factor_design = store.Prepare(
      "INSERT INTO factor_design(factor_id, vary, label, signal_by_name, signal_fields, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  Stmt ins_level_design =
      store.Prepare("INSERT INTO level_design(level_id, label, score, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  for (const auto& f : design.factors) {
    ins_factor.Bind(1, plan_id).Bind(2, f.name).Bind(3, seq).Run();
    int64_t fid = store.LastInsertId();
    const FactorSignal signal = SignalOf(design, f);
    if (f.is_between() || !f.label.empty() || !signal.by_name || !signal.fields.empty()) {
      ins_factor_design.Bind(1, fid).Bind(2, FactorVaryName(f.is_between() ? FactorVary::kBetween : FactorVary::kWithin));
      if (f.label.empty()) ins_factor_design.BindNull(3);
      else ins_factor_design.Bind(3, f.label);
      ins_factor_design.Bind(4, int64_t{signal.by_name ? 1 : 0}).Bind(5, join(signal.fields)).Bind(6, seq).Run();
    }
    for (size_t i = 0; i < f.levels.size(); ++i) {
      const std::string& l = f.levels[i];
      ins_level.Bind(1, fid).Bind(2, l).Bind(3, l == f.reference ? 1 : 0).Bind(4, seq).Run();
      const int64_t lid = store.LastInsertId();
      level_ids[{f.name, l}] = lid;
      auto label = f.labels.find(l);
      if (label == f.labels.end() && f.scores.empty()) continue;
      ins_level_design.Bind(1, lid);
      if (label == f.labels.end()) ins_level_design.BindNull(2);
      else ins_level_design.Bind(2, label->second);
      if (f.scores.empty()) ins_level_design.BindNull(3);
      else ins_level_design.Bind(3, f.scores[i]);
      ins_level_design.Bind(4, seq).Run();
    }
  }
  Stmt ins_arm = store.Prepare("INSERT INTO arm(plan_id, label, is_reference, audit_seq) VALUES (?1, ?2, ?3, ?4)");
  Stmt ins_al = store.Prepare("INSERT INTO arm_level(arm_id, level_id, audit_seq) VALUES (?1, ?2, ?3)");
  arm_ids.clear();
  for (const auto& a : design.arms) {
    ins_arm.Bind(1, plan_id).Bind(2, a.label).Bind(3, a.is_reference ? 1 : 0).Bind(4, seq).Run();
    int64_t aid = store.LastInsertId();
    arm_ids.push_back(aid);
    for (const auto& [f, l] : a.levels) ins_al.Bind(1, aid).Bind(2, level_ids.at({f, l})).Bind(3, seq).Run();
  }
  return plan_id;
}

}  // namespace twinprobe
