#pragma once
// How much two result lists overlap, for personalised listings (the same
// query and location seen by different profiles): the Jaccard distance
// between the sets of items shown,
//   J(A, B) = |A n B| / |A u B|,  distance = 1 - J   (Jaccard 1912, New
//   Phytologist 11(2):37-50 [from memory]),
// as used to measure personalisation of search results by Hannák et al.
// (2013, "Measuring personalization of web search", WWW '13), who compare treatment-vs-control
// distances with the control-vs-control noise floor.
#include <string>
#include <vector>

namespace twinprobe::stats {

// Jaccard distance between the item sets of two lists (duplicates count
// once). Two empty lists are identical: distance 0.
double JaccardDistance(std::vector<std::string> a, std::vector<std::string> b);

}  // namespace twinprobe::stats
