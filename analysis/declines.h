#pragma once
// The declines of a study's positive responses, counted for the report:
// every positive response is to be declined within the study's deadline
// ([ethics] decline_within_hours) so the employer does not hold a place for
// an applicant who does not exist. A pure function over core's reading
// (core/decline_records.h); the study clock decides whether a deadline passed.
#include <cstdint>
#include <string>

#include "core/decline_records.h"
#include "core/design.h"

namespace twinprobe {

struct DeclineCounts {
  bool present = false;          // the study has at least one positive response
  int decline_within_hours = 0;  // 0: the plan stored no deadline (nothing is due)
  std::string rule;              // "within 48 hours of receipt" (DeclineWithinWords, core/ethics_gate.h)
  int64_t positive = 0;          // current positive responses
  int64_t due = 0;               // of those, with a deadline: a deadline set and a received time
  int64_t on_time = 0;           // declined no later than the deadline
  int64_t late = 0;              // declined after the deadline
  int64_t missing = 0;           // not declined, the deadline passed
  int64_t within = 0;            // not declined, the deadline still ahead
  int64_t study_clock = 0;       // the `now` that decided "passed" (epoch seconds)
};

// Counts over the current responses in `reading` whose code `scheme` counts
// positive. due = on_time + late + missing + within. A decline at the
// deadline's second is on time; a deadline equal to `now` has not passed.
DeclineCounts CountDeclines(const DeclineReading& reading, const OutcomeScheme& scheme, int64_t now);

}  // namespace twinprobe
