#include "core/read_design.h"

#include "core/level_labels.h"
#include "core/meta.h"
#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

std::string StoredFactor::LevelLabel(const std::string& level) const {
  return LevelDisplay(LevelLabelsOf(levels, level_labels), level);
}

StoredDesign ReadStoredDesign(Store& store) {
  StoredDesign d;
  d.study_id = MetaValue(store, "study_id").value_or("");
  d.title = MetaValue(store, "title").value_or("");
  d.scheme = StoredOutcomeScheme(store);
  d.has_window = MetaValue(store, "outcomes.window_days").has_value();
  d.strata_columns = MetaList(store, "strata");
  d.records = MetaValue(store, "data").value_or("") == "applications";
  d.stages = MetaList(store, "stages");
  if (d.records) d.imported_files = ReadImportedFiles(store);

  Stmt p = store.Prepare("SELECT id FROM current_plan");
  if (!p.Step()) return d;
  const int64_t plan_id = p.Int(0);

  // A factor or level without a *_design row is what every plan before
  // migration 11 meant: varied within, signalled by the name, no label or score.
  Stmt f = store.Prepare(
      "SELECT f.id, f.name, fd.vary, fd.label, fd.signal_by_name, fd.signal_fields FROM factor f "
      "LEFT JOIN factor_design fd ON fd.factor_id = f.id WHERE f.plan_id = ?1 ORDER BY f.id");
  f.Bind(1, plan_id);
  Stmt l = store.Prepare(
      "SELECT l.name, l.is_reference, ld.label, ld.score FROM level l LEFT JOIN level_design ld ON ld.level_id = l.id "
      "WHERE l.factor_id = ?1 ORDER BY l.id");
  while (f.Step()) {
    StoredFactor sf;
    sf.name = f.Text(1);
    if (!f.IsNull(2)) {
      sf.between = ParseFactorVary(f.Text(2)) == FactorVary::kBetween;
      sf.label = f.OptText(3).value_or("");
      sf.signal.by_name = f.Int(4) != 0;
      const std::string fields = f.Text(5);
      for (size_t start = 0; start < fields.size();) {
        size_t comma = fields.find(',', start);
        if (comma == std::string::npos) comma = fields.size();
        sf.signal.fields.push_back(fields.substr(start, comma - start));
        start = comma + 1;
      }
    }
    l.Bind(1, f.Int(0));
    bool any_score = false;
    std::vector<double> scores;
    while (l.Step()) {
      sf.levels.push_back(l.Text(0));
      if (l.Int(1)) sf.reference = l.Text(0);
      sf.level_labels.push_back(l.OptText(2).value_or(""));
      any_score = any_score || !l.IsNull(3);
      scores.push_back(l.IsNull(3) ? 0.0 : l.Double(3));
    }
    l.Reset();
    if (any_score) sf.scores = scores;
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
