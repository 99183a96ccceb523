#pragma once
// "Did you mean …?" help for misspelt names.
#include <string>
#include <vector>

namespace twinprobe {

// Edit distance between two byte strings (insertions, deletions,
// substitutions and adjacent transpositions each cost 1).
int EditDistance(const std::string& a, const std::string& b);

// The candidate closest to `word` when it is close enough to be a likely
// typo (distance <= max(1, size/3)); "" otherwise.
std::string NearestName(const std::string& word, const std::vector<std::string>& candidates);

// " (did you mean 'x'?)" or "".
std::string DidYouMean(const std::string& word, const std::vector<std::string>& candidates);

}  // namespace twinprobe
