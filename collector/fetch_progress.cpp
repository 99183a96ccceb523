#include "collector/fetch_progress.h"

#include <sys/ioctl.h>
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <cstring>

namespace twinprobe {

std::string RenderProgress(size_t done, size_t total, const std::string& label, size_t width) {
  const size_t bar = 20;
  size_t filled = total ? done * bar / total : bar;
  // Appends rather than "literal" + string: g++ 12 -O2 warns falsely (-Wrestrict) on the latter.
  std::string out(1, '[');
  out.append(filled, '#').append(bar - filled, '.').append("] ").append(std::to_string(done)).append("/").append(
      std::to_string(total));
  if (!label.empty()) out += "  " + label;
  if (out.size() > width) out.resize(width);
  return out;
}

ProgressBar::ProgressBar() {
  const char* term = std::getenv("TERM");
  enabled_ = isatty(STDERR_FILENO) && !(term && std::strcmp(term, "dumb") == 0);
}

ProgressBar::~ProgressBar() { Clear(); }

void ProgressBar::Clear() {
  if (drawn_) std::fputs("\r\033[K", stderr);
  drawn_ = false;
}

void ProgressBar::Update(size_t done, size_t total, const std::string& label) {
  if (!enabled_) return;
  struct winsize ws {};
  size_t width = ioctl(STDERR_FILENO, TIOCGWINSZ, &ws) == 0 && ws.ws_col > 10 ? ws.ws_col - 1 : 79;
  std::fprintf(stderr, "\r\033[K%s", RenderProgress(done, total, label, width).c_str());
  std::fflush(stderr);
  drawn_ = true;
}

}  // namespace twinprobe
