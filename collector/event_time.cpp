#include "collector/event_time.h"

#include "core/clock.h"

namespace twinprobe {
namespace {

int64_t Day(int64_t epoch) { return epoch >= 0 ? epoch / 86400 : (epoch - 86399) / 86400; }

}  // namespace

std::string EventTime::text() const { return FormatIsoTime(epoch); }

std::optional<EventTime> ParseEventTime(std::string_view text) {
  auto t = ParseIsoTime(text);
  if (!t) return std::nullopt;
  // A bare date, with or without a trailing Z, has no time of day.
  return EventTime{*t, text.size() < 11 || text[10] == 'Z'};
}

std::string CanonicalEventText(std::string_view text) {
  // An offset needs arithmetic (and may change the day): the slow path.
  if (text.size() > 16 && (text.back() != 'Z') && (text[text.size() - 6] == '+' || text[text.size() - 6] == '-'))
    return ParseEventTime(text)->text();
  if (text.size() < 11 || text[10] == 'Z') return std::string(text.substr(0, 10)) + "T00:00:00Z";
  std::string out;
  out.reserve(20);
  out.append(text.substr(0, 10));
  out += 'T';
  out.append(text.substr(11, 5));  // HH:MM
  if (text.size() >= 19 && text[16] == ':') out.append(text.substr(16, 3));
  else out += ":00";
  out += 'Z';
  return out;
}

bool IsBefore(const EventTime& a, const EventTime& b) {
  if (a.date_only || b.date_only) return Day(a.epoch) < Day(b.epoch);
  return a.epoch < b.epoch;
}

bool IsAfterWindow(const EventTime& sent, const EventTime& response, int window_days) {
  if (sent.date_only || response.date_only) return Day(response.epoch) > Day(sent.epoch) + window_days;
  return response.epoch > sent.epoch + static_cast<int64_t>(window_days) * 86400;
}

int64_t DaysBetween(const EventTime& a, const EventTime& b) { return Day(b.epoch) - Day(a.epoch); }

}  // namespace twinprobe
