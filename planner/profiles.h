#pragma once
// Profiles: the fictitious applicants as sent (docs/architecture.md, "Words"). There is
// one profile per arm and name of the arm's pool; a profile carries every
// template field that belongs to the applicant:
//   given_name, family_name, full_name   from the name pool
//   mailbox, phone                       the contact identity, from the
//                                        [profiles] patterns ({given}, {family}, {n})
//   the pool's further columns           e.g. hometown
//   the fields of every [[factor]]       at the arm's level, e.g. birth_year
// A name used by two arms (names that signal only some of the factors) is
// one identity: the planner never sends it twice to one employer.
#include <map>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "planner/name_pools.h"

namespace twinprobe {

struct PlannedProfile {
  int arm = 0;   // index into design.arms
  int pool = 0;  // index into design.name_pools
  std::string given_name;
  std::string family_name;
  std::string mailbox;
  std::string phone;
  std::map<std::string, std::string> fields;  // every template field of the profile
  std::string full_name() const { return given_name + " " + family_name; }
};

// The pool whose levels match the arm on every name factor, or -1.
int PoolOfArm(const Design& design, const Arm& arm);

// The placeholders a contact pattern may use.
const std::vector<std::string>& ContactPlaceholders();

// Builds every profile, arm by arm in design order, names in pool order.
// Fails (FILE:LINE of the name) when two different names would share a
// mailbox or a phone number.
Result<std::vector<PlannedProfile>> BuildProfiles(const Design& design, const std::vector<NameList>& pools);

}  // namespace twinprobe
