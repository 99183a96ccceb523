#pragma once
// The fieldwork of the current plan as analysis reads it: the plan, its arms,
// and every set (the probes sent to one vacancy) with each probe's sending
// and current response. This is the one place that turns the store's rows
// into those facts; analysis/ works on the plain values returned here.
//
// Rules written once, here:
// - A probe's current response is the newest response that no other
//   response supersedes (a correction replaces what it supersedes).
// - A probe has an outcome once it has a current response; a probe without
//   one is a negative outcome ("none") once it was sent.
// - The window rule (IsClosed, IsLate): a sent probe is open from its first
//   sending until an answer (a current response whose code is not "none")
//   arrives or its observation window ([outcomes] window_days) ends, relative
//   to the study clock. An answer received after the window is kept but is
//   late: it counts as no answer (has_response and positive false). An
//   answer without a usable time is taken as within the window (it cannot
//   be judged; it is counted as untimed). An imported outcome without a
//   sending is closed (the import states a final outcome).
// - A set is complete (analysable) when every probe of it is closed:
//   IsSetComplete. A set whose probes were all sent but one is still open is
//   open, counted apart (Fieldwork::sets_open).
// - A withdrawn set (its vacancy has a withdrawal: the posting closed, the
//   employer saw through the test, an error in the listing) is neither open
//   nor analysable, whatever its probes' state: it is counted apart
//   (Fieldwork::sets_withdrawn) and left out of every tally below that the
//   analysis reads (shapes, employers, response times, open and late
//   counts). Its probes still count as planned and sent, and its responses
//   as recorded: they stay in the store.
//
// Memory: sets are not kept one by one. Sets of the same shape (the same
// strata values and the same arm/outcome pattern) are counted together, and
// the balance tables are tallies, so memory grows with strata, arms and
// outcome patterns, not with probes. Only the per-probe response times
// (SentProbe: 32 bytes a probe) and, on request, the completion order of
// the sets for interim monitoring grow with the fieldwork.
#include <array>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/design.h"

namespace twinprobe {

class Store;

// One probe of a set as the tests see it. `arm` indexes Fieldwork::arms.
struct SetProbe {
  int arm = 0;
  bool sent = false;
  bool has_response = false;  // a current response exists
  bool positive = false;      // its code counts as positive in the scheme
  bool open = false;          // sent, no answer yet, window not over (IsClosed false)
  bool late = false;          // its answer came after the window (counts as no answer)
  auto operator<=>(const SetProbe&) const = default;
};

// True when every probe is closed: sent and not open, or carrying an
// imported outcome (an empty set is not complete: a vacancy without probes
// has nothing to analyse).
bool IsSetComplete(const std::vector<SetProbe>& probes);

// The times the window rule needs for one probe (epoch seconds).
struct ProbeClock {
  std::optional<int64_t> sent_at;      // first sending; nullopt when never sent
  bool answered = false;               // a current response whose code is not "none"
  std::optional<int64_t> answered_at;  // its received_at; nullopt when it has none (untimed)
};

// True when the answer came after sent_at + window_days (needs both times).
bool IsLate(const ProbeClock& p, int window_days);
// A sent probe is closed once an answer within the window arrived, or the
// window has ended at `now`; a late answer does not close it before the
// window ends (it cannot: it comes after). An unsent probe is closed only
// when it carries an (imported) answer or outcome: `has_outcome`.
bool IsClosed(const ProbeClock& p, int64_t now, int window_days, bool has_outcome = false);
// When the probe closed or will close: the in-window answer's time, else
// sent_at + window. nullopt for an unsent probe.
std::optional<int64_t> ClosesAt(const ProbeClock& p, int window_days);

// Where one probe stands at the study clock, for a table of probes
// (`export`): withdrawn (its vacancy was withdrawn: left out whatever else
// holds), not sent (and no imported outcome), open (IsClosed false) or
// closed. The same rules ReadFieldwork counts sets by.
enum class ProbeState { kNotSent, kOpen, kClosed, kWithdrawn };
ProbeState StateOf(const ProbeClock& p, int64_t now, int window_days, bool has_outcome, bool withdrawn);
// "not_sent", "open", "closed", "withdrawn".
const char* ProbeStateName(ProbeState state);

struct FieldworkArm {
  int64_t id = 0;
  std::string label;
  bool is_reference = false;
  int64_t probes_planned = 0;  // probes of the current plan in this arm
};

// `count` sets that share one shape: the vacancy's strata (column, value;
// by column) and the probes (in probe order).
struct SetShape {
  std::vector<SetProbe> probes;
  std::vector<std::pair<std::string, std::string>> strata;
  bool complete = false;  // IsSetComplete(probes)
  int64_t count = 0;
};

// Complete sets of one employer (by pseudonymous key) with one probe pattern.
struct EmployerSets {
  std::string employer_key;
  std::vector<SetProbe> probes;
  int64_t count = 0;
};

// A sent probe's response times, for the response-time curves. Days are
// (received_at - first sent_at) / 86,400 s; NaN when there is none.
struct SentProbe {
  int32_t arm = 0;
  int32_t code = 0;               // index into Fieldwork::codes: the current code ("none" without a response)
  double first_any_days = 0;      // earliest current response whose code is not "none"
  double first_positive_days = 0; // earliest current positive response
  bool untimed_response = false;  // a response (not "none") but no received_at or no send time
  bool open = false;              // still within its window at the study clock (left out of the curves)
};

// Arm x variable tallies of the plan's probes (the balance tables).
struct BalanceTallies {
  std::map<std::pair<int, std::string>, int64_t> templates;  // (arm, template) -> probes with a template
  std::map<std::pair<int, int>, int64_t> send_orders;         // (arm, send order) -> probes
  // stratum column -> (arm, value) -> probes of vacancies with that value
  std::map<std::string, std::map<std::pair<int, std::string>, int64_t>> strata;
  // per arm, probes by weekday (0 = Monday) of their newest sending, else their planned time
  std::vector<std::array<int64_t, 7>> weekdays;
};

// A complete set and when it completed: the latest time one of its probes
// closed (ClosesAt; for a probe never marked sent, its response's
// received_at, else entered_at).
struct CompletedSet {
  int64_t vacancy_id = 0;
  int64_t completed_at = 0;  // epoch seconds
  std::vector<SetProbe> probes;
};

struct Fieldwork {
  bool has_plan = false;
  int64_t plan_id = 0;
  std::string kind;         // paired | sets | unpaired
  std::string plan_origin;  // plan | import
  std::optional<int64_t> seed;
  std::string design_sha256;  // "" for imports
  std::string plan_created_at;
  std::vector<FieldworkArm> arms;  // reference first, then by id

  int64_t vacancies = 0;
  struct StratumVacancies {
    std::string name, value;
    int64_t vacancies = 0;
  };
  std::vector<StratumVacancies> vacancies_by_stratum;  // by column, then value
  int64_t probes_planned = 0;
  int64_t probes_sent = 0;
  int64_t responses = 0;             // probes with a current response
  int64_t responses_superseded = 0;  // responses that correct an earlier one
  int64_t sets_complete = 0;    // every probe closed (analysable)
  int64_t sets_open = 0;        // every probe sent or answered, one still within its window
  int64_t sets_incomplete = 0;  // a probe not sent
  int64_t sets_unsent = 0;      // of sets_incomplete: no probe sent (nor answered)
  int64_t sets_withdrawn = 0;   // their vacancy withdrawn (in none of the counts above)
  int64_t probes_open = 0;      // sent probes still within their window
  int64_t responses_late = 0;   // probes whose current answer came after the window
  int64_t study_clock = 0;      // the `now` the window rule used (epoch seconds)
  std::string first_sent_at, last_sent_at;  // "" when nothing was sent

  std::vector<SetShape> sets;          // by shape, in first-seen (vacancy) order
  std::vector<EmployerSets> employers; // complete sets with an employer key, by key
  std::vector<std::string> codes;      // codes seen, "none" first (SentProbe::code)
  std::vector<SentProbe> sent;         // every sent probe, in vacancy order
  BalanceTallies balance;
  std::vector<CompletedSet> completed;  // only with ReadOptions::completion_order, in completion order
};

struct FieldworkOptions {
  bool completion_order = false;  // fill Fieldwork::completed (interim monitoring)
  // The study clock for the window rule; nullopt: NowEpoch() (the computer's
  // clock, or $TWINPROBE_NOW).
  std::optional<int64_t> now;
};

// Reads the current plan (has_plan = false when the store holds none).
// `scheme` decides which codes are positive. Throws StoreError only for
// SQLite failures the user cannot cause.
Fieldwork ReadFieldwork(Store& store, const OutcomeScheme& scheme, const FieldworkOptions& options = {});

}  // namespace twinprobe
