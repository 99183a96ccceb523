#include "analysis/strongest_evidence.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

namespace {

ListingComparison Stratum(const std::string& query, double p, std::optional<double> p_adjusted) {
  ListingComparison c;
  c.query = query;
  c.gap_p = p;
  c.gap_p_adjusted = p_adjusted;
  return c;
}

std::vector<std::string> Order(const ListingAudit& a) {
  std::vector<std::string> queries;
  for (const ListingComparison* c : StrongestEvidence(a)) queries.push_back(c->query);
  return queries;
}

}  // namespace

TEST_CASE("issue 24: strongest evidence breaks ties in the adjusted p by the raw p") {
  // The case the issue reports: three strata whose Holm-adjusted p is 1,
  // listed in stored order (p 0.519, p 0.931) while p 0.0888 was left out.
  ListingAudit a;
  a.by_stratum = {Stratum("clerk", 0.519, 1.0), Stratum("driver", 0.931, 1.0), Stratum("cook", 0.0888, 1.0),
                  Stratum("nurse", 0.001, 0.012)};
  CHECK(Order(a) == std::vector<std::string>{"nurse", "cook", "clerk", "driver"});
}

TEST_CASE("strongest evidence: without an adjusted p the raw p orders, equal ones keep their stored order") {
  ListingAudit a;
  a.by_stratum = {Stratum("a", 0.5, std::nullopt), Stratum("b", 0.2, std::nullopt), Stratum("c", 0.5, std::nullopt)};
  CHECK(Order(a) == std::vector<std::string>{"b", "a", "c"});
  CHECK(StrongestEvidence(ListingAudit{}).empty());
}
