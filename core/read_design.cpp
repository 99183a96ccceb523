#include "core/read_design.h"

#include "core/meta.h"
#include "core/store.h"

namespace twinprobe {

StoredDesign ReadStoredDesign(Store& store) {
  StoredDesign d;
  d.study_id = MetaValue(store, "study_id").value_or("");
  d.title = MetaValue(store, "title").value_or("");
  d.scheme = StoredOutcomeScheme(store);
  d.has_window = MetaValue(store, "outcomes.window_days").has_value();
  d.strata_columns = MetaList(store, "strata");
  d.records = MetaValue(store, "data").value_or("") == "applications";
  d.stages = MetaList(store, "stages");

  Stmt p = store.Prepare("SELECT id FROM current_plan");
  if (!p.Step()) return d;
  const int64_t plan_id = p.Int(0);

  Stmt f = store.Prepare("SELECT id, name FROM factor WHERE plan_id = ?1 ORDER BY id");
  f.Bind(1, plan_id);
  Stmt l = store.Prepare("SELECT name, is_reference FROM level WHERE factor_id = ?1 ORDER BY id");
  while (f.Step()) {
    StoredFactor sf;
    sf.name = f.Text(1);
    l.Bind(1, f.Int(0));
    while (l.Step()) {
      sf.levels.push_back(l.Text(0));
      if (l.Int(1)) sf.reference = l.Text(0);
    }
    l.Reset();
    d.factors.push_back(sf);
  }

  Stmt pr = store.Prepare("SELECT arm_id, count(*) FROM profile WHERE plan_id = ?1 GROUP BY arm_id");
  pr.Bind(1, plan_id);
  while (pr.Step()) d.profiles_by_arm[pr.Int(0)] = pr.Int(1);

  Stmt e = store.Prepare(
      "SELECT count(DISTINCT employer_key) FROM vacancy WHERE plan_id = ?1 AND employer_key IS NOT NULL");
  e.Bind(1, plan_id);
  if (e.Step()) d.employers = e.Int(0);
  return d;
}

}  // namespace twinprobe
