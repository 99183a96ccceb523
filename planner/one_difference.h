#pragma once
// The proof that the probes of a set differ in the tested attribute only
// (`check`, and `plan` and `render` before they write anything).
//
// For every set (the probes sent to one vacancy), every template used in
// the set is rendered with the fields of every probe of the set, and the
// renderings are compared place by place. The literal text of a template is
// the same for every probe, so renderings can only differ where a field is
// filled in; a difference is allowed only in a field a factor controls:
//   - the fields listed in [templates].factor_fields (by default the name and
//     contact fields: given_name, family_name, full_name, mailbox, phone), and
//   - the fields a [[factor]] sets per level (fields = { … }).
// Any other difference (a pool column such as hometown whose values differ,
// a column that one pool has and another lacks) is reported with the field,
// the place the template uses it, and the probes involved.
//
// Unpaired designs have sets of one probe, so there the comparison is across
// arms: an uncontrolled profile field must offer the same values to every arm.
//
// Also checked: every field a template uses exists, and every template shows
// every factor (through a name field for a name factor, through one of its
// fields otherwise) so no probe goes out without the attribute's signal.
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "planner/materials.h"
#include "planner/template_text.h"

namespace twinprobe {

struct ProbeValue {
  std::string probe;
  std::string arm;
  std::optional<std::string> value;  // nullopt: the probe has no such field
};

struct FieldLeak {
  std::string field;
  std::string where;          // FILE:LINE:COL of the field's first use in a template
  std::string template_path;  // the template holding that use
  int64_t sets_affected = 0;  // sets (or, unpaired, arms) where it differs
  // Every affected set: its vacancy and the probes with their values. For an
  // unpaired design, one entry per arm whose values differ from the first arm's.
  std::vector<std::pair<std::string, std::vector<ProbeValue>>> sets;

  // "templates/cv.md:5:3: field 'hometown' differs …" as one error.
  Error AsError() const;
};

struct OneDifferenceReport {
  int64_t sets_checked = 0;
  int64_t renderings = 0;  // template renderings compared
  std::vector<std::string> controlled_fields;
  std::vector<FieldLeak> leaks;
  bool ok() const { return leaks.empty(); }
};

// The fields a factor controls (see above), sorted.
std::vector<std::string> ControlledFields(const Design& design);

// Runs the proof over `probes` (grouped by vacancy, as PlannedMaterials and
// StoredMaterials return them). Hard errors (an unknown field, a template
// that never shows a factor) come back as the error; leaks in the report.
Result<OneDifferenceReport> ProveOneDifference(const Design& design,
                                               const std::map<std::string, TemplateDoc>& templates,
                                               const std::vector<ProbeMaterial>& probes);

}  // namespace twinprobe
