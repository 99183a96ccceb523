#pragma once
// The rows of a plan below its header (core/plan_header.h): employers,
// vacancies with their strata, profiles and probes; and the facts about the
// current plan that decide whether `plan` may replace it. Which rows a plan
// has is the planner's (planner/plan_store.h).
#include <cstdint>
#include <optional>
#include <string>

#include "core/store.h"

namespace twinprobe {

// True when the store holds a plan (planned or imported).
bool HasCurrentPlan(Store& store);

// How far the current plan is in the field.
struct CurrentPlanFieldwork {
  int64_t sendings = 0;   // sending rows of its probes
  int64_t responses = 0;  // response rows of its probes (superseded ones too)
};
CurrentPlanFieldwork ReadCurrentPlanFieldwork(Store& store);

struct VacancyInsert {
  int64_t plan_id = 0;
  std::string ref;
  std::string employer_key;
  std::string opened_on;  // as given ("" is stored as "")
};

struct ProfileInsert {
  int64_t plan_id = 0;
  int64_t arm_id = 0;
  std::string display_name;
  std::string mailbox, phone;
  std::string fields_json;  // JSON object of the template fields
};

struct ProbeInsert {
  int64_t plan_id = 0;
  std::string ref;  // P00001 …
  int64_t vacancy_id = 0, profile_id = 0, arm_id = 0;
  std::optional<std::string> template_path;  // nullopt: the design has no templates
  int send_order = 1;
  std::string planned_at;  // ISO time
};

// Appends the rows of one plan; statements are prepared once. Use inside the
// caller's AuditedWrite (`seq`); the vacancy source is "file".
class PlanRowWriter {
 public:
  explicit PlanRowWriter(Store& store);
  // The employer table keeps one row per key (the first name and contact);
  // purge empties it.
  void InsertEmployer(const std::string& key, const std::string& name, const std::string& contact);
  int64_t InsertVacancy(int64_t seq, const VacancyInsert& row);
  void InsertVacancyStratum(int64_t seq, int64_t vacancy_id, const std::string& name, const std::string& value);
  int64_t InsertProfile(int64_t seq, const ProfileInsert& row);
  int64_t InsertProbe(int64_t seq, const ProbeInsert& row);

 private:
  Store& store_;
  Stmt employer_, vacancy_, stratum_, profile_, probe_;
};

}  // namespace twinprobe
