#include "core/suggest.h"

#include <algorithm>

namespace twinprobe {

int EditDistance(const std::string& a, const std::string& b) {
  std::vector<int> row(b.size() + 1);
  for (size_t j = 0; j <= b.size(); ++j) row[j] = static_cast<int>(j);
  for (size_t i = 1; i <= a.size(); ++i) {
    int diag = row[0];
    row[0] = static_cast<int>(i);
    for (size_t j = 1; j <= b.size(); ++j) {
      int up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
}

std::string NearestName(const std::string& word, const std::vector<std::string>& candidates) {
  std::string best;
  int best_d = std::max<int>(1, static_cast<int>(word.size()) / 3) + 1;
  for (const auto& c : candidates) {
    int d = EditDistance(word, c);
    if (d < best_d) {
      best_d = d;
      best = c;
    }
  }
  return best;
}

std::string DidYouMean(const std::string& word, const std::vector<std::string>& candidates) {
  std::string n = NearestName(word, candidates);
  return n.empty() ? std::string() : " (did you mean '" + n + "'?)";
}

}  // namespace twinprobe
