#include "planner/materials.h"

#include <nlohmann/json.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <unordered_map>

#include "core/clock.h"
#include "core/csv.h"
#include "core/material_rows.h"
#include "core/plan_rows.h"
#include "core/safe_write.h"
#include "core/sha256.h"
#include "planner/markdown.h"
#include "planner/name_pools.h"

namespace twinprobe {
namespace {

std::map<std::string, std::string> VacancyFields(const Vacancy& v) {
  std::map<std::string, std::string> out;
  for (const auto& [k, value] : v.fields)
    if (IsFieldName(k)) out[k] = value;
  return out;
}

Status CheckNoClash(const Design& d, const std::vector<Vacancy>& vacancies, const std::string& field,
                    const std::string& source) {
  if (!vacancies.empty() && vacancies.front().fields.count(field))
    return BadInput((vacancies.front().file.empty() ? d.vacancies_file : vacancies.front().file) + ":1",
                    "the column '" + field + "' has the name of a profile field (from " + source + ")",
                    "rename the column or the profile field");
  return {};
}

}  // namespace

const std::string* ProbeMaterial::Lookup(const std::string& field) const {
  if (auto it = profile.find(field); it != profile.end()) return &it->second;
  if (auto it = vacancy.find(field); it != vacancy.end()) return &it->second;
  return nullptr;
}

std::map<std::string, std::string> ProbeMaterial::AllFields() const {
  std::map<std::string, std::string> all = vacancy;
  for (const auto& [k, v] : profile) all[k] = v;
  return all;
}

std::string ProbeRef(int64_t serial) {
  char ref[24];
  std::snprintf(ref, sizeof ref, "P%05lld", static_cast<long long>(serial));
  return ref;
}

Result<std::vector<ProbeMaterial>> PlannedMaterials(const Design& d, const std::vector<Vacancy>& vacancies,
                                                    const std::vector<NameList>& pools, const Plan& plan) {
  for (size_t i = 0; i < plan.profiles.size(); ++i)
    for (const auto& [field, value] : plan.profiles[i].fields)
      if (Status s = CheckNoClash(d, vacancies, field, pools[plan.profiles[i].pool].file); !s.ok()) return s.error();
  std::vector<ProbeMaterial> out;
  out.reserve(plan.probes.size());
  std::vector<std::map<std::string, std::string>> vacancy_fields(vacancies.size());
  for (size_t v = 0; v < vacancies.size(); ++v) vacancy_fields[v] = VacancyFields(vacancies[v]);
  int64_t serial = 0;
  for (const auto& p : plan.probes) {
    ProbeMaterial m;
    m.probe_ref = ProbeRef(++serial);
    m.vacancy_ref = vacancies[p.vacancy].ref;
    m.arm_label = d.arms[p.arm].label;
    m.send_order = p.send_order;
    m.planned_at = FormatIsoTime(p.planned_at);
    m.template_path = d.templates.empty() ? "" : d.templates[p.template_index];
    const PlannedProfile& profile = plan.profiles[p.profile];
    m.source = pools[profile.pool].file;
    m.profile = profile.fields;
    m.vacancy = vacancy_fields[p.vacancy];
    out.push_back(std::move(m));
  }
  return out;
}

Result<std::vector<ProbeMaterial>> StoredMaterials(Store& store, const Design& d, const std::vector<Vacancy>& vacancies) {
  if (!HasCurrentPlan(store))
    return BadInput(store.path(), "the store holds no plan yet", "run 'twinprobe plan' first");
  std::unordered_map<std::string, const Vacancy*> by_ref;
  for (const auto& v : vacancies) by_ref[v.ref] = &v;
  std::vector<ProbeMaterial> out;
  std::map<std::string, std::map<std::string, std::string>> vacancy_fields;
  bool clash_checked = false;
  for (const MaterialRow& row : ReadMaterialRows(store)) {
    ProbeMaterial m;
    m.probe_ref = row.probe_ref;
    m.vacancy_ref = row.vacancy_ref;
    m.arm_label = row.arm_label;
    m.send_order = row.send_order;
    m.planned_at = row.planned_at;
    m.template_path = row.template_path;
    m.source = "study.db";
    auto it = by_ref.find(m.vacancy_ref);
    if (it == by_ref.end())
      return BadInput(vacancies.empty() || vacancies.front().file.empty() ? d.vacancies_file : vacancies.front().file,
                      "vacancy '" + m.vacancy_ref + "' of the stored plan is not in the file any more",
                      "restore its row; the materials take the vacancy's fields from this file");
    auto& vf = vacancy_fields[m.vacancy_ref];
    if (vf.empty()) vf = VacancyFields(*it->second);
    m.vacancy = vf;
    if (row.profile_fields_json) {
      auto json = nlohmann::json::parse(*row.profile_fields_json, nullptr, false);
      if (json.is_object())
        for (const auto& [k, v] : json.items())
          if (v.is_string()) m.profile[k] = v.get<std::string>();
    }
    if (!clash_checked) {
      for (const auto& [field, value] : m.profile)
        if (Status s = CheckNoClash(d, vacancies, field, "the stored profile"); !s.ok()) return s.error();
      clash_checked = true;
    }
    out.push_back(std::move(m));
  }
  return out;
}

Result<std::map<std::string, TemplateDoc>> LoadTemplates(const std::string& study_dir, const Design& d) {
  std::map<std::string, TemplateDoc> docs;
  for (const auto& path : d.templates) {
    auto doc = LoadTemplate(study_dir, path);
    if (!doc.ok()) return doc.error();
    docs.emplace(path, std::move(doc).value());
  }
  return docs;
}

Result<RenderedDocs> RenderMaterial(const TemplateDoc& doc, const ProbeMaterial& probe) {
  for (const auto& s : doc.segments)
    if (s.is_field && !probe.Lookup(s.text))
      return BadInput(s.file + ":" + std::to_string(s.line) + ":" + std::to_string(s.column),
                      "probe " + probe.probe_ref + " has no value for the field '" + s.text + "'",
                      "give every profile this field (all name pools need the same columns), or remove it");
  std::vector<std::string> values;
  auto tokens = FillTemplateWithTokens(doc, probe.AllFields(), values);
  if (!tokens.ok()) return tokens.error();
  RenderedDocs r;
  r.markdown = MarkdownWithValues(tokens.value(), values);
  r.text = MarkdownToText(tokens.value(), values);
  r.html = MarkdownToHtml(tokens.value(), values);
  return r;
}

Result<MaterialsWritten> WriteMaterials(const std::string& out_dir, int64_t plan_id,
                                        const std::map<std::string, TemplateDoc>& templates,
                                        const std::vector<ProbeMaterial>& probes,
                                        const std::function<void(size_t, size_t)>& progress) {
  namespace fs = std::filesystem;
  std::error_code ec;
  fs::create_directories(out_dir, ec);
  if (ec) return BadInput(out_dir, "cannot create the materials folder: " + ec.message(), "check the path and permissions");
  MaterialsWritten w;
  w.manifest = (fs::path(out_dir) / "manifest.csv").string();
  std::string manifest =
      "plan,probe,vacancy,arm,send_order,planned_at,template,markdown,markdown_sha256,text,text_sha256,html,html_sha256\n";
  for (size_t i = 0; i < probes.size(); ++i) {
    const ProbeMaterial& p = probes[i];
    auto doc = templates.find(p.template_path);
    if (doc == templates.end())
      return BadInput(out_dir, "probe " + p.probe_ref + " uses the template '" + p.template_path +
                                   "', which the design no longer names",
                      "restore it under [templates].files, or make a new plan");
    auto rendered = RenderMaterial(doc->second, p);
    if (!rendered.ok()) return rendered.error();
    std::string row = std::to_string(plan_id) + "," + CsvQuote(p.probe_ref) + "," + CsvQuote(p.vacancy_ref) + "," + CsvQuote(p.arm_label) + "," +
                      std::to_string(p.send_order) + "," + CsvQuote(p.planned_at) + "," + CsvQuote(p.template_path);
    for (const auto& [ext, body] : {std::pair<const char*, const std::string*>{".md", &rendered.value().markdown},
                                    {".txt", &rendered.value().text},
                                    {".html", &rendered.value().html}}) {
      std::string name = p.probe_ref + ext;
      // Written beside and renamed: a link planted at materials/P00001.html
      // is replaced, never written through (core/safe_write.h).
      if (Status written = WriteFileSafely((fs::path(out_dir) / name).string(), *body); !written.ok())
        return BadInput((fs::path(out_dir) / name).string(), "cannot write the file", "check the folder is writable");
      std::string sha = Sha256Hex(*body);
      row += "," + CsvQuote(name) + "," + sha;
      w.written.push_back({p.probe_ref, name, std::move(sha)});
      ++w.files;
    }
    manifest += row + "\n";
    ++w.probes;
    if (progress) progress(i + 1, probes.size());
  }
  w.manifest_sha256 = Sha256Hex(manifest);
  if (Status written = WriteFileSafely(w.manifest, manifest); !written.ok())
    return BadInput(w.manifest, "cannot write the file", "check the folder is writable");
  ++w.files;
  return w;
}

}  // namespace twinprobe
