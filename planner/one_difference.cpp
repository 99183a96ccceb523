#include "planner/one_difference.h"

#include <algorithm>
#include <set>

#include "core/suggest.h"
#include "planner/name_pools.h"

namespace twinprobe {
namespace {

std::string Quoted(const ProbeValue& v) { return v.value ? "'" + *v.value + "'" : "(no such field)"; }

std::string Position(const TemplateSegment& s) {
  return s.file + ":" + std::to_string(s.line) + ":" + std::to_string(s.column);
}

// Every template must show every factor.
Status CheckSignals(const Design& d, const std::map<std::string, TemplateDoc>& templates) {
  static const std::vector<std::string> kNameFields = {"given_name", "family_name", "full_name"};
  for (const auto& [path, doc] : templates) {
    auto uses = doc.FieldUses();
    for (const auto& f : d.factors) {
      bool named = std::find(d.name_factors.begin(), d.name_factors.end(), f.name) != d.name_factors.end();
      std::vector<std::string> shows;
      if (named) shows = kNameFields;
      for (const auto& [field, values] : f.fields) shows.push_back(field);
      bool shown = std::any_of(shows.begin(), shows.end(), [&](const std::string& x) { return uses.count(x) > 0; });
      if (!shown) {
        std::string list;
        for (const auto& x : shows) list += (list.empty() ? "" : ", ") + x;
        return BadInput(doc.segments.empty() ? path : doc.segments.front().file,
                        "the template never shows factor '" + f.name + "' (it uses none of " + list + ")",
                        "use one of these fields, or the probes sent with this template carry no signal of it");
      }
    }
  }
  return {};
}

}  // namespace

Error FieldLeak::AsError() const {
  std::string example;
  if (!sets.empty()) {
    example = " (" + std::string(sets.front().first.empty() ? "" : "set " + sets.front().first + ": ");
    const auto& probes = sets.front().second;
    for (size_t i = 0; i < probes.size(); ++i)
      example += (i ? ", " : "") + probes[i].probe + " " + Quoted(probes[i]);
    example += ")";
  }
  bool unpaired = !sets.empty() && sets.front().first.empty();
  std::string what = unpaired ? "field '" + field + "' takes different values in different arms, but no factor controls it" +
                                    example
                              : "field '" + field + "' differs between the probes of " + std::to_string(sets_affected) +
                                    (sets_affected == 1 ? " set" : " sets") + ", but no factor controls it" + example;
  return BadInput(where, what,
                  "make it the same in every name pool, remove it from the template, or list it in "
                  "[templates].factor_fields if a factor truly sets it");
}

std::vector<std::string> ControlledFields(const Design& d) {
  std::set<std::string> c(d.factor_fields.begin(), d.factor_fields.end());
  for (const auto& f : d.factors)
    for (const auto& [field, values] : f.fields) c.insert(field);
  return {c.begin(), c.end()};
}

Result<OneDifferenceReport> ProveOneDifference(const Design& d, const std::map<std::string, TemplateDoc>& templates,
                                               const std::vector<ProbeMaterial>& probes) {
  OneDifferenceReport report;
  report.controlled_fields = ControlledFields(d);
  const std::set<std::string> controlled(report.controlled_fields.begin(), report.controlled_fields.end());

  // Unknown fields: used by a template, given by no probe at all.
  // Every vacancy has the same columns; profiles may differ (pools with
  // different columns), so all of them are looked at.
  std::set<std::string> known;
  if (!probes.empty())
    for (const auto& [k, v] : probes.front().vacancy) known.insert(k);
  for (const auto& p : probes)
    for (const auto& [k, v] : p.profile) known.insert(k);
  for (const auto& [path, doc] : templates)
    for (const auto& [field, seg] : doc.FieldUses())
      if (!known.count(field))
        return BadInput(Position(*seg), "unknown field '" + field + "'" +
                                            DidYouMean(field, std::vector<std::string>(known.begin(), known.end())),
                        "use a field of the profile or the vacancy (see docs/render.md)");
  if (Status s = CheckSignals(d, templates); !s.ok()) return s.error();

  // The uncontrolled fields each template uses, with their first place.
  std::map<std::string, std::vector<std::pair<std::string, const TemplateSegment*>>> uncontrolled;
  for (const auto& [path, doc] : templates)
    for (const auto& [field, seg] : doc.FieldUses())
      if (!controlled.count(field)) uncontrolled[path].emplace_back(field, seg);

  std::map<std::string, FieldLeak> leaks;  // by field
  auto leak_of = [&](const std::string& field, const std::string& path, const TemplateSegment* seg) -> FieldLeak& {
    FieldLeak& l = leaks[field];
    if (l.field.empty()) {
      l.field = field;
      l.where = Position(*seg);
      l.template_path = path;
    }
    return l;
  };

  if (d.kind != "unpaired") {
    for (size_t begin = 0; begin < probes.size();) {
      size_t end = begin;
      while (end < probes.size() && probes[end].vacancy_ref == probes[begin].vacancy_ref) ++end;
      ++report.sets_checked;
      std::set<std::string> set_templates;
      for (size_t i = begin; i < end; ++i) set_templates.insert(probes[i].template_path);
      std::set<std::string> reported;  // a field is reported once per set
      for (const auto& path : set_templates) {
        report.renderings += static_cast<int64_t>(end - begin);
        auto it = uncontrolled.find(path);
        if (it == uncontrolled.end()) continue;
        for (const auto& [field, seg] : it->second) {
          if (reported.count(field)) continue;
          std::vector<ProbeValue> values;
          bool differs = false;
          for (size_t i = begin; i < end; ++i) {
            const std::string* v = probes[i].Lookup(field);
            values.push_back({probes[i].probe_ref, probes[i].arm_label,
                              v ? std::optional<std::string>(*v) : std::nullopt});
            differs = differs || values.back().value != values.front().value;
          }
          if (!differs) continue;
          reported.insert(field);
          FieldLeak& l = leak_of(field, path, seg);
          ++l.sets_affected;
          l.sets.emplace_back(probes[begin].vacancy_ref, std::move(values));
        }
      }
      begin = end;
    }
  } else {
    // Per arm, the values each uncontrolled profile field takes, with a probe showing each.
    std::map<std::string, std::map<std::string, std::map<std::optional<std::string>, std::string>>> by_field;
    for (const auto& p : probes) {
      ++report.sets_checked;
      ++report.renderings;
      // Only what this probe's own template shows can differ in its materials.
      auto it = uncontrolled.find(p.template_path);
      if (it == uncontrolled.end()) continue;
      for (const auto& [field, seg] : it->second) {
        if (p.vacancy.count(field) && !p.profile.count(field)) continue;  // a vacancy field is not arm-dependent
        const std::string* v = p.Lookup(field);
        by_field[field][p.arm_label].emplace(v ? std::optional<std::string>(*v) : std::nullopt, p.probe_ref);
      }
    }
    for (const auto& [path, fields] : uncontrolled)
      for (const auto& [field, seg] : fields) {
        auto& per_arm = by_field[field];
        if (per_arm.size() < 2 || leaks.count(field)) continue;
        const auto& first = per_arm.begin()->second;
        for (auto it = std::next(per_arm.begin()); it != per_arm.end(); ++it) {
          bool same = it->second.size() == first.size() &&
                      std::equal(it->second.begin(), it->second.end(), first.begin(),
                                 [](const auto& a, const auto& b) { return a.first == b.first; });
          if (same) continue;
          FieldLeak& l = leak_of(field, path, seg);
          ++l.sets_affected;
          // One probe of each arm with a value the other arm does not offer.
          std::vector<ProbeValue> example;
          for (const auto& [value, probe] : first)
            if (!it->second.count(value)) {
              example.push_back({probe, per_arm.begin()->first, value});
              break;
            }
          for (const auto& [value, probe] : it->second)
            if (!first.count(value)) {
              example.push_back({probe, it->first, value});
              break;
            }
          l.sets.emplace_back("", std::move(example));
        }
      }
  }
  for (auto& [field, leak] : leaks) report.leaks.push_back(std::move(leak));
  return report;
}

}  // namespace twinprobe
