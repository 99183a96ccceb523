#include "analysis/design_summary.h"

#include "core/meta.h"
#include "core/store.h"

namespace twinprobe {

DesignSummary SummariseDesign(Store& store) {
  DesignSummary d;
  Stmt p = store.Prepare("SELECT id, design_sha256, seed, created_at FROM current_plan");
  if (!p.Step()) return d;
  const int64_t plan_id = p.Int(0);
  d.design_sha256 = p.IsNull(1) ? "" : p.Text(1);
  d.has_seed = !p.IsNull(2);
  d.seed = d.has_seed ? p.Int(2) : 0;
  d.plan_created_at = p.Text(3);
  if (auto w = MetaValue(store, "outcomes.window_days")) d.window_days = std::stoi(*w);
  d.strata_columns = MetaList(store, "strata");

  Stmt f = store.Prepare("SELECT id, name FROM factor WHERE plan_id = ?1 ORDER BY id");
  f.Bind(1, plan_id);
  Stmt l = store.Prepare("SELECT name, is_reference FROM level WHERE factor_id = ?1 ORDER BY id");
  while (f.Step()) {
    DesignFactorSummary fs;
    fs.name = f.Text(1);
    l.Bind(1, f.Int(0));
    while (l.Step()) {
      fs.levels.push_back(l.Text(0));
      if (l.Int(1)) fs.reference = l.Text(0);
    }
    l.Reset();
    d.factors.push_back(fs);
  }

  Stmt a = store.Prepare(
      "SELECT a.label, a.is_reference, "
      "  (SELECT count(*) FROM profile pr WHERE pr.arm_id = a.id), "
      "  (SELECT count(*) FROM probe pb WHERE pb.arm_id = a.id) "
      "FROM arm a WHERE a.plan_id = ?1 ORDER BY a.is_reference DESC, a.id");
  a.Bind(1, plan_id);
  while (a.Step()) d.arms.push_back({a.Text(0), a.Int(1) != 0, a.Int(2), a.Int(3)});

  Stmt s = store.Prepare(
      "SELECT vs.name, vs.value, count(*) FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id "
      "WHERE v.plan_id = ?1 GROUP BY vs.name, vs.value ORDER BY vs.name, vs.value");
  s.Bind(1, plan_id);
  while (s.Step()) d.strata.push_back({s.Text(0), s.Text(1), s.Int(2)});

  Stmt t = store.Prepare(
      "SELECT DISTINCT template FROM probe WHERE plan_id = ?1 AND template IS NOT NULL ORDER BY template");
  t.Bind(1, plan_id);
  while (t.Step()) d.templates.push_back(t.Text(0));

  Stmt e = store.Prepare(
      "SELECT count(DISTINCT employer_key) FROM vacancy WHERE plan_id = ?1 AND employer_key IS NOT NULL");
  e.Bind(1, plan_id);
  if (e.Step()) d.employers = e.Int(0);

  Stmt w = store.Prepare(
      "SELECT min(s.sent_at), max(s.sent_at) FROM sending s JOIN probe p ON p.id = s.probe_id WHERE p.plan_id = ?1");
  w.Bind(1, plan_id);
  if (w.Step() && !w.IsNull(0)) {
    d.first_sent_at = w.Text(0);
    d.last_sent_at = w.Text(1);
  }
  return d;
}

}  // namespace twinprobe
