#include "core/progress.h"

#include <sys/ioctl.h>
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <iostream>

namespace twinprobe {
namespace {

constexpr int kBarWidth = 24;
// A bar for work shorter than this would only flicker. TWINPROBE_PROGRESS_DELAY_MS
// overrides it (0 = draw at once), so a test on a fast machine still sees a bar.
std::chrono::milliseconds FirstDrawAfter() {
  if (const char* v = std::getenv("TWINPROBE_PROGRESS_DELAY_MS"); v && *v) {
    char* end = nullptr;
    long ms = std::strtol(v, &end, 10);
    if (*end == '\0' && ms >= 0) return std::chrono::milliseconds(ms);
  }
  return std::chrono::milliseconds(300);
}
constexpr auto kRedrawEvery = std::chrono::milliseconds(100);

std::string Amount(int64_t n, Progress::Unit unit) {
  if (unit == Progress::Unit::kCount) return std::to_string(n);
  char buf[32];
  if (n < 1000) std::snprintf(buf, sizeof buf, "%lld B", static_cast<long long>(n));
  else if (n < 1000 * 1000) std::snprintf(buf, sizeof buf, "%.1f kB", n / 1e3);
  else if (n < 1000LL * 1000 * 1000) std::snprintf(buf, sizeof buf, "%.1f MB", n / 1e6);
  else std::snprintf(buf, sizeof buf, "%.2f GB", n / 1e9);
  return buf;
}

// A terminal that cannot move the cursor back ("dumb", e.g. an editor's
// shell buffer) would print every redraw on a line of its own.
bool StderrTakesABar() {
  if (!isatty(STDERR_FILENO)) return false;
  const char* term = std::getenv("TERM");
  return !(term && std::strcmp(term, "dumb") == 0);
}

// A line longer than the terminal wraps, and "\r" then redraws only its last
// row; keep one column free so the cursor never wraps either.
size_t TerminalColumns() {
  struct winsize ws {};
  if (ioctl(STDERR_FILENO, TIOCGWINSZ, &ws) == 0 && ws.ws_col > 10) return ws.ws_col - 1u;
  return 79;
}

}  // namespace

Progress::Progress(std::string label, int64_t total, Unit unit)
    : Progress(std::move(label), total, unit, StderrTakesABar() ? &std::cerr : nullptr) {
  if (out_) max_width_ = TerminalColumns();
}

Progress::Progress(std::string label, int64_t total, Unit unit, std::ostream* out)
    : label_(std::move(label)), total_(total), unit_(unit), out_(out),
      first_draw_after_(FirstDrawAfter()), started_(std::chrono::steady_clock::now()), last_draw_(started_) {}

Progress::~Progress() { Finish(); }

std::string Progress::Render(const std::string& label, int64_t done, int64_t total, Unit unit) {
  if (total <= 0) return label + "  " + Amount(done, unit);
  int64_t clamped = done < 0 ? 0 : done > total ? total : done;
  int filled = static_cast<int>(clamped * kBarWidth / total);
  int percent = static_cast<int>(clamped * 100 / total);
  char pct[8];
  std::snprintf(pct, sizeof pct, "%3d%%", percent);
  return label + " [" + std::string(filled, '#') + std::string(kBarWidth - filled, '-') + "] " + pct + "  " +
         Amount(clamped, unit) + " of " + Amount(total, unit);
}

void Progress::Update(int64_t done) {
  if (!out_ || finished_) return;
  done_ = done;
  auto now = std::chrono::steady_clock::now();
  bool first = !drawn_;
  if (now - started_ < first_draw_after_ || (!first && now - last_draw_ < kRedrawEvery)) return;
  last_draw_ = now;
  Draw();
}

void Progress::Draw() {
  std::string line = Render(label_, done_, total_, unit_);
  if (!detail_.empty()) line += "  " + detail_;
  if (max_width_ && line.size() > max_width_) {
    size_t cut = max_width_;  // never inside a UTF-8 sequence
    while (cut > 0 && (static_cast<unsigned char>(line[cut]) & 0xC0) == 0x80) --cut;
    line.resize(cut);
  }
  // Pad with spaces so a shorter line fully covers the previous one.
  size_t width = line.size();
  if (width < last_width_) line += std::string(last_width_ - width, ' ');
  last_width_ = width;
  *out_ << '\r' << line << std::flush;
  drawn_ = true;
}

void Progress::Finish() {
  if (!out_ || finished_) return;
  finished_ = true;
  if (!drawn_) return;
  Draw();
  *out_ << '\n' << std::flush;
}

}  // namespace twinprobe
