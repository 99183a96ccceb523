#include "collector/time_rules.h"

#include "core/clock.h"
#include "core/sending_records.h"

namespace twinprobe {
namespace {

std::string TimeWords(TimedEvent e) {
  switch (e) {
    case TimedEvent::kSending: return "sending time";
    case TimedEvent::kResponse: return "response time";
    case TimedEvent::kDecline: return "decline time";
  }
  return "time";
}

// The year as written ("0202"), so the message shows the typo as typed.
std::string YearOf(int64_t epoch) { return FormatIsoTime(epoch).substr(0, 4); }

}  // namespace

TimeRules StudyTimeRules(Store& store, int early_days) {
  TimeRules rules;
  rules.now = NowEpoch();
  rules.early_days = early_days;
  if (auto first = FirstPlannedSending(store)) rules.schedule_start = ParseIsoTime(*first);
  return rules;
}

Status CheckPlausibleTime(const TimeRules& rules, const TimedFact& f, const std::string& where) {
  const std::string said = "the " + TimeWords(f.event) + " " + f.at.text() + " of " + f.probe_ref;
  // The year first: a mistyped year would otherwise read as "in the future"
  // or "before the schedule", which hides the typo.
  const std::string year = YearOf(f.at.epoch);
  if (std::stoi(year) < kFirstPlausibleYear || std::stoi(year) > kLastPlausibleYear)
    return BadInput(where, said + " is in the year " + year + ", outside " +
                               std::to_string(kFirstPlausibleYear) + "–" + std::to_string(kLastPlausibleYear),
                    "check the year; write the time as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  // A date alone is "some time that day": it is in the future only when the
  // whole day is.
  if (f.at.epoch > rules.now + kClockSkewSeconds)
    return BadInput(where, said + " is in the future (now is " + FormatIsoTime(rules.now) + ")",
                    "check the date; record an event once it has happened");
  if (f.event == TimedEvent::kSending && rules.schedule_start) {
    const int64_t earliest = *rules.schedule_start - int64_t{rules.early_days} * 86400;
    if (IsBefore(f.at, EventTime{earliest, false}))
      return BadInput(where, said + " is before the schedule starts (" + FormatIsoTime(*rules.schedule_start) +
                                 ", less [schedule] early_days = " + std::to_string(rules.early_days) + ")",
                      "check the date; if the applications really left earlier, raise [schedule] early_days in "
                      "study.toml");
  }
  if (f.after && IsBefore(f.at, *f.after)) {
    if (f.event == TimedEvent::kResponse)
      return BadInput(where, said + " is before its sending (" + f.after->text() + ")",
                      "check the date; if the sending time is wrong, correct it first with 'twinprobe sent " +
                          f.probe_ref + " --at TIME'");
    return BadInput(where, said + " is before the " + f.after_words + " was received (" + f.after->text() + ")",
                    "check the date; a decline answers a response already received");
  }
  return {};
}

}  // namespace twinprobe
