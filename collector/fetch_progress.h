#pragma once
// A one-line progress bar on stderr, drawn only when stderr is a terminal
// (docs/architecture.md: long work shows progress on a terminal and stays quiet
// otherwise). Rendering is a pure function so it can be tested.
#include <cstddef>
#include <string>

namespace twinprobe {

// "[#########...........]  12/40  https://…" cut to `width` columns.
std::string RenderProgress(size_t done, size_t total, const std::string& label, size_t width);

class ProgressBar {
 public:
  ProgressBar();  // enabled when stderr is a terminal and TERM is not "dumb"
  ~ProgressBar();  // clears the line
  ProgressBar(const ProgressBar&) = delete;
  ProgressBar& operator=(const ProgressBar&) = delete;
  void Update(size_t done, size_t total, const std::string& label);
  void Clear();  // erases the bar's line (before printing a report)
  bool enabled() const { return enabled_; }

 private:
  bool enabled_ = false;
  bool drawn_ = false;
};

}  // namespace twinprobe
