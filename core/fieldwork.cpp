#include "core/fieldwork.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <unordered_map>
#include <unordered_set>

#include "core/clock.h"
#include "core/store.h"

namespace twinprobe {
namespace {

constexpr double kSecondsPerDay = 86400.0;
constexpr double kNone = std::numeric_limits<double>::quiet_NaN();

struct SendingRow {
  int64_t id = 0;
  std::string sent_at;
};

struct ResponseRow {
  int64_t id = 0;
  std::string code;
  std::optional<std::string> received_at, entered_at;
};

// The probe being read: the main query returns one row per (sending,
// response) of a probe, so a probe with two sendings and a correction comes
// four times; its rows are gathered here and deduplicated by id.
struct ProbeRows {
  int64_t id = -1;
  int arm = 0;
  std::optional<std::string> template_path, planned_at;
  int send_order = 1;
  std::vector<SendingRow> sendings;
  std::vector<ResponseRow> responses;
};

// Walks the plan's vacancies in id order alongside the probes (a merge on
// vacancy id: every cursor ascends), with each vacancy's employer key and
// strata. Every vacancy of the plan is visited, with probes or without, so
// the vacancy counts per stratum value come from the same pass. The
// vacancies are read in rowid order ("+plan_id": not through the
// (plan_id, ref) index, which would sort them in a temporary B-tree).
class VacancyCursor {
 public:
  VacancyCursor(Store& store, int64_t plan_id)
      : vacancies_(store.Prepare("SELECT id, employer_key FROM vacancy WHERE +plan_id = ?1 ORDER BY id")),
        strata_(store.Prepare("SELECT vacancy_id, name, value FROM vacancy_stratum ORDER BY vacancy_id, name")) {
    vacancies_.Bind(1, plan_id);
    more_vacancies_ = vacancies_.Step();
    more_strata_ = strata_.Step();
  }

  // Moves to `vacancy_id` (visiting every plan vacancy before it); false
  // when it is not a vacancy of the plan. Then employer() and strata().
  bool MoveTo(int64_t vacancy_id) {
    while (more_vacancies_ && vacancies_.Int(0) < vacancy_id) Visit();
    if (!more_vacancies_ || vacancies_.Int(0) != vacancy_id) return false;
    Visit();
    return true;
  }
  void Finish() {
    while (more_vacancies_) Visit();
  }
  const std::string& employer() const { return employer_; }
  const std::vector<std::pair<std::string, std::string>>& strata() const { return strata_of_; }
  int64_t visited() const { return visited_; }
  // (column, value) -> vacancies, over every vacancy visited.
  const std::map<std::pair<std::string, std::string>, int64_t>& counts() const { return counts_; }

 private:
  void Visit() {
    const int64_t id = vacancies_.Int(0);
    employer_ = vacancies_.IsNull(1) ? std::string() : vacancies_.Text(1);
    strata_of_.clear();
    while (more_strata_ && strata_.Int(0) < id) more_strata_ = strata_.Step();
    while (more_strata_ && strata_.Int(0) == id) {
      strata_of_.emplace_back(strata_.Text(1), strata_.Text(2));
      ++counts_[strata_of_.back()];
      more_strata_ = strata_.Step();
    }
    ++visited_;
    more_vacancies_ = vacancies_.Step();
  }

  Stmt vacancies_, strata_;
  bool more_vacancies_ = false, more_strata_ = false;
  std::string employer_;
  std::vector<std::pair<std::string, std::string>> strata_of_;
  std::map<std::pair<std::string, std::string>, int64_t> counts_;
  int64_t visited_ = 0;
};

void AppendShapeKey(std::string& key, const std::vector<SetProbe>& probes) {
  for (const SetProbe& p : probes) {
    key += std::to_string(p.arm);
    key += p.sent ? 's' : '-';
    key += p.has_response ? 'r' : '-';
    key += p.positive ? '+' : '-';
  }
}

}  // namespace

bool IsSetComplete(const std::vector<SetProbe>& probes) {
  if (probes.empty()) return false;
  return std::all_of(probes.begin(), probes.end(),
                     [](const SetProbe& p) { return (p.sent || p.has_response) && !p.open; });
}

bool IsLate(const ProbeClock& p, int window_days) {
  if (!p.sent_at || !p.answered || !p.answered_at) return false;
  return *p.answered_at > *p.sent_at + int64_t{window_days} * 86400;
}

bool IsClosed(const ProbeClock& p, int64_t now, int window_days, bool has_outcome) {
  if (!p.sent_at) return has_outcome;
  if (p.answered && !IsLate(p, window_days)) return true;  // an answer within the window (or untimed)
  return now >= *p.sent_at + int64_t{window_days} * 86400;
}

std::optional<int64_t> ClosesAt(const ProbeClock& p, int window_days) {
  if (!p.sent_at) return std::nullopt;
  if (p.answered && p.answered_at && !IsLate(p, window_days)) return std::max(*p.sent_at, *p.answered_at);
  return *p.sent_at + int64_t{window_days} * 86400;
}

ProbeState StateOf(const ProbeClock& p, int64_t now, int window_days, bool has_outcome, bool withdrawn) {
  if (withdrawn) return ProbeState::kWithdrawn;
  if (!p.sent_at && !has_outcome) return ProbeState::kNotSent;
  return IsClosed(p, now, window_days, has_outcome) ? ProbeState::kClosed : ProbeState::kOpen;
}

const char* ProbeStateName(ProbeState state) {
  switch (state) {
    case ProbeState::kNotSent: return "not_sent";
    case ProbeState::kOpen: return "open";
    case ProbeState::kClosed: return "closed";
    case ProbeState::kWithdrawn: return "withdrawn";
  }
  return "";
}

Fieldwork ReadFieldwork(Store& store, const OutcomeScheme& scheme, const FieldworkOptions& options) {
  Fieldwork f;
  const int64_t now = options.now.value_or(NowEpoch());
  const int window_days = scheme.window_days;
  f.study_clock = now;
  {
    Stmt p = store.Prepare("SELECT id, kind, origin, seed, design_sha256, created_at FROM current_plan");
    if (!p.Step()) return f;
    f.has_plan = true;
    f.plan_id = p.Int(0);
    f.kind = p.Text(1);
    f.plan_origin = p.Text(2);
    if (!p.IsNull(3)) f.seed = p.Int(3);
    f.design_sha256 = p.OptText(4).value_or("");
    f.plan_created_at = p.Text(5);
  }
  std::unordered_map<int64_t, int> arm_index;
  {
    Stmt a = store.Prepare("SELECT id, label, is_reference FROM arm WHERE plan_id = ?1 ORDER BY is_reference DESC, id");
    a.Bind(1, f.plan_id);
    while (a.Step()) {
      arm_index[a.Int(0)] = static_cast<int>(f.arms.size());
      f.arms.push_back({a.Int(0), a.Text(1), a.Int(2) != 0, 0});
    }
  }
  f.balance.weekdays.assign(f.arms.size(), {});
  // Corrections are few: the ids they supersede fit in memory.
  std::unordered_set<int64_t> superseded;
  {
    Stmt s = store.Prepare("SELECT supersedes FROM response WHERE supersedes IS NOT NULL");
    while (s.Step()) superseded.insert(s.Int(0));
  }

  // Withdrawn vacancies are few: their ids fit in memory.
  std::unordered_set<int64_t> withdrawn;
  {
    Stmt w = store.Prepare(
        "SELECT DISTINCT w.vacancy_id FROM withdrawal w JOIN vacancy v ON v.id = w.vacancy_id WHERE v.plan_id = ?1");
    w.Bind(1, f.plan_id);
    while (w.Step()) withdrawn.insert(w.Int(0));
  }

  std::unordered_map<std::string, int32_t> code_index;
  auto intern = [&](const std::string& code) {
    auto [it, added] = code_index.emplace(code, static_cast<int32_t>(f.codes.size()));
    if (added) f.codes.push_back(code);
    return it->second;
  };
  intern("none");

  VacancyCursor vacancy_cursor(store, f.plan_id);
  static const std::vector<std::pair<std::string, std::string>> kNoStrata;
  std::unordered_map<std::string, size_t> shape_index;
  std::map<std::string, size_t> employer_index;  // key + pattern -> index (sorted by key)
  std::string key;

  int64_t set_vacancy = -1;
  bool set_withdrawn = false;
  int64_t set_completed_at = 0;
  std::vector<SetProbe> set_probes;

  auto finish_set = [&] {
    if (set_vacancy < 0) return;
    const bool known = vacancy_cursor.MoveTo(set_vacancy);
    if (set_withdrawn) {  // out of every analysed tally; still in the plan's balance tables
      ++f.sets_withdrawn;
      if (known)
        for (const auto& [column, value] : vacancy_cursor.strata())
          for (const SetProbe& p : set_probes) ++f.balance.strata[column][{p.arm, value}];
      set_probes.clear();
      set_completed_at = 0;
      return;
    }
    const auto& strata = known ? vacancy_cursor.strata() : kNoStrata;
    const bool complete = IsSetComplete(set_probes);
    const bool all_sent = std::all_of(set_probes.begin(), set_probes.end(),
                                      [](const SetProbe& p) { return p.sent || p.has_response; });
    ++(complete ? f.sets_complete : all_sent ? f.sets_open : f.sets_incomplete);
    if (std::none_of(set_probes.begin(), set_probes.end(), [](const SetProbe& p) { return p.sent || p.has_response; }))
      ++f.sets_unsent;
    key.clear();
    AppendShapeKey(key, set_probes);
    for (const auto& [column, value] : strata) {
      key += '\x1f';
      key += column;
      key += '\x1e';
      key += value;
    }
    auto [it, added] = shape_index.emplace(key, f.sets.size());
    if (added) f.sets.push_back({set_probes, strata, complete, 0});
    ++f.sets[it->second].count;
    if (complete) {
      const std::string employer = known ? vacancy_cursor.employer() : std::string();
      if (!employer.empty()) {
        key = employer + '\x1f';
        AppendShapeKey(key, set_probes);
        auto [eit, eadded] = employer_index.emplace(key, 0);
        if (eadded) {
          eit->second = f.employers.size();
          f.employers.push_back({employer, set_probes, 0});
        }
        ++f.employers[eit->second].count;
      }
      if (options.completion_order) f.completed.push_back({set_vacancy, set_completed_at, set_probes});
    }
    set_probes.clear();
    set_completed_at = 0;
  };

  auto finish_probe = [&](ProbeRows& pr) {
    if (pr.id < 0) return;
    // The sending facts: first sending (send time), newest sending (weekday).
    const SendingRow* first = nullptr;
    const SendingRow* newest = nullptr;
    for (const auto& s : pr.sendings) {
      if (!first || s.sent_at < first->sent_at) first = &s;
      if (!newest || s.id > newest->id) newest = &s;
      if (f.first_sent_at.empty() || s.sent_at < f.first_sent_at) f.first_sent_at = s.sent_at;
      if (s.sent_at > f.last_sent_at) f.last_sent_at = s.sent_at;
    }
    // The current responses: those no correction supersedes; the newest of them gives the outcome.
    const ResponseRow* current = nullptr;
    SentProbe sp{pr.arm, 0, kNone, kNone, false};
    // A plain value and a flag, not std::optional: GCC 12 at -O3 warns that
    // an engaged optional may be read uninitialised here (a false positive).
    int64_t sent_epoch = 0;
    bool has_sent_epoch = false;
    if (first)
      if (auto t = ParseIsoTime(first->sent_at)) sent_epoch = *t, has_sent_epoch = true;
    for (const auto& r : pr.responses) {
      if (superseded.count(r.id)) continue;
      if (!current || r.id > current->id) current = &r;
      if (!first || r.code == "none") continue;
      const std::optional<int64_t> received = r.received_at ? ParseIsoTime(*r.received_at) : std::nullopt;
      if (!received || !has_sent_epoch) {
        sp.untimed_response = true;
        continue;
      }
      const double days = static_cast<double>(*received - sent_epoch) / kSecondsPerDay;
      if (std::isnan(sp.first_any_days) || days < sp.first_any_days) sp.first_any_days = days;
      if (scheme.is_positive(r.code) && (std::isnan(sp.first_positive_days) || days < sp.first_positive_days))
        sp.first_positive_days = days;
    }
    // The window rule (IsClosed, IsLate): a late answer counts as no answer.
    ProbeClock clock;
    if (first && has_sent_epoch) clock.sent_at = sent_epoch;
    clock.answered = current && current->code != "none";
    if (clock.answered && current->received_at) clock.answered_at = ParseIsoTime(*current->received_at);
    const bool late = IsLate(clock, window_days);
    const bool open = first && has_sent_epoch && !IsClosed(clock, now, window_days, current != nullptr);
    SetProbe probe{pr.arm, first != nullptr, current != nullptr && !late,
                   current && !late && scheme.is_positive(current->code), open, late};
    if (late && !set_withdrawn) ++f.responses_late;
    if (open && !set_withdrawn) ++f.probes_open;
    ++f.probes_planned;
    ++f.arms[static_cast<size_t>(pr.arm)].probes_planned;
    if (probe.sent) ++f.probes_sent;
    if (probe.has_response) ++f.responses;
    if (first && !set_withdrawn) {
      sp.code = current && !late ? intern(current->code) : 0;
      sp.open = open;
      if (!std::isnan(sp.first_any_days)) sp.untimed_response = false;
      f.sent.push_back(sp);
    }
    // Completion time of the set: the latest of its probes' times.
    int64_t at = 0;
    if (first) at = has_sent_epoch ? ClosesAt(clock, window_days).value_or(0) : 0;
    else if (current) {
      const auto& when = current->received_at ? current->received_at : current->entered_at;
      at = when ? ParseIsoTime(*when).value_or(0) : 0;
    }
    set_completed_at = std::max(set_completed_at, at);
    set_probes.push_back(probe);

    // Balance tallies.
    if (pr.template_path) ++f.balance.templates[{pr.arm, *pr.template_path}];
    ++f.balance.send_orders[{pr.arm, pr.send_order}];
    std::optional<int64_t> weekday_time;
    if (newest == first && has_sent_epoch) weekday_time = sent_epoch;  // one sending: parsed above
    else if (newest) weekday_time = ParseIsoTime(newest->sent_at);
    else if (pr.planned_at) weekday_time = ParseIsoTime(*pr.planned_at);
    if (weekday_time) ++f.balance.weekdays[static_cast<size_t>(pr.arm)][static_cast<size_t>(WeekdayOf(*weekday_time))];
  };

  // One pass over the plan's probes in vacancy order, each with its
  // sendings and responses (LEFT JOINs: a probe may have none of either).
  // "+p.plan_id" keeps SQLite from choosing the (plan_id, ref) index, which
  // would sort every row in a temporary B-tree; the probe_vacancy index gives
  // the vacancy order as it is read, so nothing is held but the current set.
  Stmt q = store.Prepare(
      "SELECT p.id, p.vacancy_id, p.arm_id, p.template, p.send_order, p.planned_at, "
      "  s.id, s.sent_at, r.id, r.code, r.received_at, r.entered_at, r.supersedes "
      "FROM probe p LEFT JOIN sending s ON s.probe_id = p.id LEFT JOIN response r ON r.probe_id = p.id "
      "WHERE +p.plan_id = ?1 ORDER BY p.vacancy_id, p.id");
  q.Bind(1, f.plan_id);
  ProbeRows pr;
  while (q.Step()) {
    const int64_t probe_id = q.Int(0);
    if (probe_id != pr.id) {
      finish_probe(pr);
      const int64_t v = q.Int(1);
      if (v != set_vacancy) {
        finish_set();
        set_vacancy = v;
        set_withdrawn = withdrawn.count(v) > 0;
      }
      pr.id = probe_id;
      pr.arm = arm_index.at(q.Int(2));
      pr.template_path = q.OptText(3);
      pr.send_order = static_cast<int>(q.Int(4));
      pr.planned_at = q.OptText(5);
      pr.sendings.clear();
      pr.responses.clear();
    }
    if (!q.IsNull(6)) {
      const int64_t sid = q.Int(6);
      if (std::none_of(pr.sendings.begin(), pr.sendings.end(), [&](const SendingRow& s) { return s.id == sid; }))
        pr.sendings.push_back({sid, q.Text(7)});
    }
    if (!q.IsNull(8)) {
      const int64_t rid = q.Int(8);
      if (std::none_of(pr.responses.begin(), pr.responses.end(), [&](const ResponseRow& r) { return r.id == rid; })) {
        pr.responses.push_back({rid, q.Text(9), q.OptText(10), q.OptText(11)});
        if (!q.IsNull(12)) ++f.responses_superseded;
      }
    }
  }
  finish_probe(pr);
  finish_set();
  vacancy_cursor.Finish();
  f.vacancies = vacancy_cursor.visited();
  for (const auto& [value, n] : vacancy_cursor.counts()) f.vacancies_by_stratum.push_back({value.first, value.second, n});

  // Balance by stratum: the probes of each vacancy, by its stratum values.
  for (const SetShape& s : f.sets)
    for (const auto& [column, value] : s.strata)
      for (const SetProbe& p : s.probes) f.balance.strata[column][{p.arm, value}] += s.count;

  std::stable_sort(f.completed.begin(), f.completed.end(),
                   [](const CompletedSet& x, const CompletedSet& y) { return x.completed_at < y.completed_at; });
  return f;
}

}  // namespace twinprobe
