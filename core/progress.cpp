#include "core/progress.h"

#include <unistd.h>

#include <cstdio>
#include <iostream>

namespace twinprobe {
namespace {

constexpr int kBarWidth = 24;
// A bar for work shorter than this would only flicker.
constexpr auto kFirstDrawAfter = std::chrono::milliseconds(300);
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

}  // namespace

Progress::Progress(std::string label, int64_t total, Unit unit)
    : Progress(std::move(label), total, unit, isatty(STDERR_FILENO) ? &std::cerr : nullptr) {}

Progress::Progress(std::string label, int64_t total, Unit unit, std::ostream* out)
    : label_(std::move(label)), total_(total), unit_(unit), out_(out),
      started_(std::chrono::steady_clock::now()), last_draw_(started_) {}

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
  if (now - started_ < kFirstDrawAfter || now - last_draw_ < kRedrawEvery) return;
  last_draw_ = now;
  Draw();
}

void Progress::Draw() {
  std::string line = Render(label_, done_, total_, unit_);
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
