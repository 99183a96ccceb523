#pragma once
// The materials of probes: which template each probe uses and the fields it
// is filled with, from an in-memory plan (`check`) or from the stored plan
// (`render`), and rendering one probe's documents as Markdown, plain text
// and HTML.
//
// A probe's fields are its profile's (planner/profiles.h) and its vacancy's:
// every column of the vacancies file whose header is a field name
// ({{vacancy}}, {{employer}}, {{occupation}} …). A name may not be both.
#include <cstdint>
#include <functional>
#include <map>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"
#include "planner/assign.h"
#include "planner/template_text.h"
#include "planner/vacancies.h"

namespace twinprobe {

struct ProbeMaterial {
  std::string probe_ref;    // P00001 …
  std::string vacancy_ref;  // the set it belongs to
  std::string arm_label;
  int send_order = 1;
  std::string planned_at;   // ISO time
  std::string template_path;
  std::string source;       // where the profile fields come from (a pool file, or "study.db")
  std::map<std::string, std::string> profile;  // profile fields
  std::map<std::string, std::string> vacancy;  // vacancy fields
  // The field's value, or nullptr when the probe has no such field.
  const std::string* Lookup(const std::string& field) const;
  std::map<std::string, std::string> AllFields() const;
};

// Probes of an in-memory plan, with the references StorePlan will give them.
// Fails when a vacancy column has the name of a profile field.
Result<std::vector<ProbeMaterial>> PlannedMaterials(const Design& design, const std::vector<Vacancy>& vacancies,
                                                    const std::vector<NameList>& pools, const Plan& plan);

// Probes of the stored current plan, vacancy fields from the vacancies file.
// Fails when the store has no plan or a planned vacancy is missing from the file.
Result<std::vector<ProbeMaterial>> StoredMaterials(Store& store, const Design& design,
                                                   const std::vector<Vacancy>& vacancies);

// Every template the design names, loaded (includes resolved), by path.
Result<std::map<std::string, TemplateDoc>> LoadTemplates(const std::string& study_dir, const Design& design);

struct RenderedDocs {
  std::string markdown;
  std::string text;
  std::string html;
};

// Fills the probe's template. Fails at the field's FILE:LINE:COL when the
// probe has no value for a field the template uses.
Result<RenderedDocs> RenderMaterial(const TemplateDoc& doc, const ProbeMaterial& probe);

struct WrittenFile {
  std::string probe_ref;
  std::string file;  // P00001.md …, inside the output folder
  std::string sha256;
};

struct MaterialsWritten {
  int64_t probes = 0;
  int64_t files = 0;
  std::string manifest;         // path of manifest.csv
  std::string manifest_sha256;  // of its bytes
  std::vector<WrittenFile> written;  // every probe's files (not the manifest)
};

// Writes OUT/PROBE.md, .txt and .html for every probe, and OUT/manifest.csv
// (plan, probe, vacancy, arm, send order, planned time, template, each file
// with its SHA-256, so what was sent can be shown later and which plan it
// belongs to is on every row). Creates OUT. `progress` is
// called after each probe with (done, total). Fails on the first probe that
// cannot be rendered or a file that cannot be written (files already written stay).
Result<MaterialsWritten> WriteMaterials(const std::string& out_dir, int64_t plan_id,
                                        const std::map<std::string, TemplateDoc>& templates,
                                        const std::vector<ProbeMaterial>& probes,
                                        const std::function<void(size_t, size_t)>& progress);

// "P00001" for serial 1 (the probe references StorePlan writes).
std::string ProbeRef(int64_t serial);

}  // namespace twinprobe
