#include "core/suggest.h"

#include <algorithm>

namespace twinprobe {

int EditDistance(const std::string& a, const std::string& b) {
  // Optimal string alignment: Levenshtein plus adjacent transpositions, the
  // commonest typing slip ("sede" for "seed" is one edit, not two).
  const size_t n = a.size(), m = b.size();
  std::vector<std::vector<int>> d(n + 1, std::vector<int>(m + 1));
  for (size_t i = 0; i <= n; ++i) d[i][0] = static_cast<int>(i);
  for (size_t j = 0; j <= m; ++j) d[0][j] = static_cast<int>(j);
  for (size_t i = 1; i <= n; ++i)
    for (size_t j = 1; j <= m; ++j) {
      int cost = a[i - 1] == b[j - 1] ? 0 : 1;
      d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
      if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1]) d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
    }
  return d[n][m];
}

std::string NearestName(const std::string& word, const std::vector<std::string>& candidates) {
  std::string best;
  int best_d = std::max<int>(1, static_cast<int>(word.size()) / 3) + 1;
  for (const auto& c : candidates) {
    // The distance is at least the difference in length: a 2 MB word is
    // never compared cell by cell with a ten-letter key.
    const size_t longer = std::max(word.size(), c.size()), shorter = std::min(word.size(), c.size());
    if (longer - shorter >= static_cast<size_t>(best_d)) continue;
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
