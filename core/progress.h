#pragma once
// The one progress bar for long work (imports, fetching, rendering, mail
// intake, permutation tests): drawn on stderr only when stderr is a terminal
// (and TERM is not "dumb"), quiet otherwise, so logs and pipes stay clean.
// It first draws after 0.3 s (TWINPROBE_PROGRESS_DELAY_MS overrides that;
// 0 draws at once), then at most ten times a second; Update() is cheap
// enough to call once per row. On a terminal a line is cut to its width.
//
//   Progress bar("importing pairs.csv", file_bytes, Progress::Unit::kBytes);
//   while (...) bar.Update(reader.bytes_consumed());
//   bar.Update(file_bytes);
//   bar.Finish();  // draws the final state and ends the line
#include <chrono>
#include <cstdint>
#include <ostream>
#include <string>

namespace twinprobe {

class Progress {
 public:
  enum class Unit { kCount, kBytes };

  // Draws on stderr when it is a TTY; otherwise does nothing. `total` <= 0
  // means unknown: the bar then shows the count only.
  Progress(std::string label, int64_t total, Unit unit = Unit::kCount);
  // Draws on `out` whatever it is (tests, or a caller that decided itself).
  Progress(std::string label, int64_t total, Unit unit, std::ostream* out);
  ~Progress();  // Finish() if not done yet
  Progress(const Progress&) = delete;
  Progress& operator=(const Progress&) = delete;

  void Update(int64_t done);
  // For work whose size is known only once it starts (0 = unknown).
  void SetTotal(int64_t total) { total_ = total; }
  // Text shown after the amounts, e.g. the URL being fetched; "" for none.
  // Takes effect with the next redraw.
  void SetDetail(std::string detail) { detail_ = std::move(detail); }
  // Draws the last state given to Update() and ends the line (once); call
  // Update(total) first when the work completed. A bar that never drew
  // (quiet, or work shorter than its first redraw delay) prints nothing.
  void Finish();
  bool enabled() const { return out_ != nullptr; }

  // One rendered line without the leading "\r", e.g.
  // "importing a.csv [##########----------]  50%  1.5 MB of 3.0 MB".
  static std::string Render(const std::string& label, int64_t done, int64_t total, Unit unit);

 private:
  void Draw();

  std::string label_;
  std::string detail_;
  int64_t total_;
  Unit unit_;
  std::ostream* out_;
  int64_t done_ = 0;
  bool drawn_ = false;
  bool finished_ = false;
  size_t last_width_ = 0;
  size_t max_width_ = 0;  // the terminal's columns - 1; 0 = no limit
  std::chrono::milliseconds first_draw_after_;
  std::chrono::steady_clock::time_point started_, last_draw_;
};

}  // namespace twinprobe
