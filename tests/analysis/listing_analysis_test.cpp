#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

#include "core/read_study.h"
#include "analysis/analyze.h"
#include "analysis/listing_analysis.h"
#include "core/audit.h"
#include "core/store.h"

using namespace twinprobe;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

struct Row {
  std::string query, location, seen_by;
  std::vector<std::string> items;  // in order of position
};

// An in-memory store holding the given lists and labels.
std::unique_ptr<Store> StoreWith(const std::vector<Row>& lists,
                                 const std::vector<std::tuple<std::string, std::string, std::string>>& labels) {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  auto store = std::move(opened.value());
  AuditedWrite w(*store, "test");
  for (const auto& l : lists) {
    Stmt ins = store->Prepare(
        "INSERT INTO listing(source, query, location, seen_by, fetched_at, audit_seq) VALUES ('test', ?1, ?2, ?3, "
        "'2027-03-01T00:00:00Z', ?4)");
    ins.Bind(1, l.query).Bind(2, l.location);
    if (l.seen_by.empty()) ins.BindNull(3);
    else ins.Bind(3, l.seen_by);
    ins.Bind(4, w.seq()).Run();
    int64_t id = store->LastInsertId();
    for (size_t p = 0; p < l.items.size(); ++p)
      store->Prepare("INSERT INTO listing_item(listing_id, position, item_key, audit_seq) VALUES (?1, ?2, ?3, ?4)")
          .Bind(1, id)
          .Bind(2, static_cast<int64_t>(p + 1))
          .Bind(3, l.items[p])
          .Bind(4, w.seq())
          .Run();
  }
  for (const auto& [item, factor, level] : labels)
    store->Prepare("INSERT INTO item_label(item_key, factor, level, audit_seq) VALUES (?1, ?2, ?3, ?4)")
        .Bind(1, item)
        .Bind(2, factor)
        .Bind(3, level)
        .Bind(4, w.seq())
        .Run();
  w.Commit("test lists");
  return store;
}

const ListingGroup& Group(const ListingAudit& a, const std::string& label) {
  for (const auto& g : a.groups)
    if (g.label == label) return g;
  FAIL("no group " << label);
  throw;
}

}  // namespace

TEST_CASE("listing analysis: group summaries of two small lists, worked by hand") {
  // Two lists of 4 in one stratum; a, b coastal; c, d inland; e unlabelled.
  auto store = StoreWith({{"clerk", "Orlinde", "", {"c", "a", "d", "b"}}, {"clerk", "Orlinde", "", {"d", "c", "e", "a"}}},
                         {{"a", "origin", "coastal"}, {"b", "origin", "coastal"}, {"c", "origin", "inland"},
                          {"d", "origin", "inland"}});
  ListingOptions o;
  o.discount = stats::DiscountSpec{stats::Discount::kReciprocal};
  o.top_k = 2;
  o.resamples = 99;
  auto r = AnalyzeListings(ReadListings(*store), o);
  REQUIRE(r.ok());
  const ListingAudit& a = r.value();
  CHECK(a.present);
  CHECK(a.listings == 2);
  CHECK(a.appearances == 8);
  CHECK(a.labelled_appearances == 7);
  CHECK(a.strata == 1);
  REQUIRE(a.factors == std::vector<std::string>{"origin"});
  // No plan: the reference is the level with the most places (inland 4, coastal 3).
  CHECK(a.levels[0] == std::vector<std::string>{"inland", "coastal"});
  const ListingGroup& inland = Group(a, "origin=inland");
  // inland at 1, 3 (list 1) and 1, 2 (list 2): exposure (1 + 1/3 + 1 + 1/2)/4.
  CHECK(inland.appearances == 4);
  CHECK_THAT(inland.exposure, WithinRel((1 + 1.0 / 3 + 1 + 0.5) / 4, 1e-15));
  // Top 2 holds 4 places, 3 of them inland.
  CHECK_THAT(inland.top_k_share, WithinRel(0.75, 1e-15));
  CHECK(inland.mean_position == 1.75);
  CHECK(inland.median_position == 1.5);
  // Exposure share: inland's total over every place's (including e's).
  const double all = 2 * (1 + 0.5 + 1.0 / 3 + 0.25);
  CHECK_THAT(inland.exposure_share, WithinRel((1 + 1.0 / 3 + 1 + 0.5) / all, 1e-15));
  REQUIRE(a.overall.size() == 1);
  CHECK(a.overall[0].reference == "inland");
  CHECK_THAT(a.overall[0].exposure_gap, WithinAbs(inland.exposure - Group(a, "origin=coastal").exposure, 1e-15));
  CHECK(a.by_stratum.empty());  // one stratum: the overall comparison is the stratum's
  REQUIRE(a.widest.has_value());
  CHECK(a.widest->description == "origin: inland | coastal");
}

TEST_CASE("listing analysis: the plan's reference level wins over the most frequent level") {
  auto store = StoreWith({{"q", "l", "", {"x1", "y1", "y2"}}},  // coastal has more places
                         {{"x1", "origin", "inland"}, {"y1", "origin", "coastal"}, {"y2", "origin", "coastal"}});
  ListingOptions o;
  o.resamples = 9;
  CHECK(AnalyzeListings(ReadListings(*store), o).value().levels[0].front() == "coastal");  // most places
  AuditedWrite w(*store, "plan");
  store->Exec("INSERT INTO plan(origin, kind, created_at, audit_seq) VALUES ('plan', 'paired', 'x', " +
              std::to_string(w.seq()) + ")");
  store->Exec("INSERT INTO factor(plan_id, name, audit_seq) VALUES (1, 'origin', " + std::to_string(w.seq()) + ")");
  store->Exec("INSERT INTO level(factor_id, name, is_reference, audit_seq) VALUES (1, 'inland', 1, " +
              std::to_string(w.seq()) + ")");
  w.Commit("plan");
  CHECK(AnalyzeListings(ReadListings(*store), o).value().levels[0].front() == "inland");
}

TEST_CASE("listing analysis: strata, neighbour disparity, paired tests and profile overlap") {
  // Two factors, two queries x one location, lists seen by two profiles.
  std::vector<std::tuple<std::string, std::string, std::string>> labels;
  const char* genders = "fmfmfmfm";
  for (int i = 0; i < 8; ++i) {
    std::string item = "i" + std::to_string(i);
    labels.emplace_back(item, "gender", std::string(1, genders[i]));
    labels.emplace_back(item, "origin", i < 4 ? "inland" : "coastal");
  }
  auto store = StoreWith({{"clerk", "Orlinde", "p1", {"i0", "i1", "i2", "i3", "i4", "i5", "i6", "i7"}},
                          {"clerk", "Orlinde", "p2", {"i0", "i2", "i1", "i3", "i5", "i4", "i7", "i6"}},
                          {"cook", "Orlinde", "p1", {"i4", "i0", "i5", "i1", "i6", "i2", "i7", "i3"}},
                          {"cook", "Orlinde", "p2", {"i0", "i4", "i1", "i5", "i2", "i6", "i3", "i7"}}},
                         labels);
  ListingOptions o;
  o.resamples = 199;
  auto r = AnalyzeListings(ReadListings(*store), o);
  REQUIRE(r.ok());
  const ListingAudit& a = r.value();
  CHECK(a.strata == 2);
  CHECK(a.by_stratum.size() == 4);  // 2 factors x 2 strata
  // Holm (the default correction) across the 2 strata of each comparison,
  // by hand: the smaller p doubled, the larger kept (never below the first).
  for (size_t k = 0; k < 4; k += 2) {
    const auto& x = a.by_stratum[k];
    const auto& y = a.by_stratum[k + 1];
    REQUIRE(x.factor == y.factor);
    REQUIRE(x.gap_p_adjusted.has_value());
    const double lo = std::min(x.gap_p, y.gap_p), hi = std::max(x.gap_p, y.gap_p);
    const double lo_adj = std::min(1.0, 2 * lo), hi_adj = std::max(lo_adj, hi);
    CHECK(*x.gap_p_adjusted == (x.gap_p <= y.gap_p ? lo_adj : hi_adj));
    CHECK(*y.gap_p_adjusted == (x.gap_p <= y.gap_p ? hi_adj : lo_adj));
    CHECK(*x.emd_p_adjusted >= x.emd_p);
  }
  CHECK(a.paired.size() == 2);
  CHECK(a.paired[0].strata == 2);
  // Cells: 4 (gender x origin) on top of 4 levels.
  CHECK(a.groups.size() == 8);
  REQUIRE(a.disparity.size() == 2);  // groups and queries; one location is no ranking
  CHECK(a.disparity[0].dimension == "group");
  CHECK(a.disparity[1].dimension == "query");
  // "clerk" lists put inland on top (disparity high), "cook" interleaves.
  CHECK(a.disparity[1].most.front().value == "clerk");
  REQUIRE(a.overlap.size() == 1);
  CHECK(a.overlap[0].profile_a == "p1");
  CHECK(a.overlap[0].profile_b == "p2");
  CHECK(a.overlap[0].mean_jaccard_distance == 0.0);  // same items, other order
  CHECK(a.overlap[0].comparisons == 2);
}

TEST_CASE("listing analysis: a store with lists but no plan analyses as kind 'listing'") {
  auto store = StoreWith({{"q", "l", "", {"a", "b"}}}, {{"a", "g", "x"}, {"b", "g", "y"}});
  auto r = Analyze(ReadStudy(*store, OutcomeScheme{}), store->path(), OutcomeScheme{}, AnalysisPlan{});
  REQUIRE(r.ok());
  CHECK(r.value().kind == "listing");
  CHECK(r.value().listings.present);
  CHECK(r.value().listings.listing_only);
}

TEST_CASE("listing analysis: an empty store still says that it holds no plan") {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  auto r = Analyze(ReadStudy(*opened.value(), OutcomeScheme{}), opened.value()->path(), OutcomeScheme{}, AnalysisPlan{});
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() ==
        ":memory:: the store holds no plan yet \u2014 run 'twinprobe plan' or 'twinprobe import pairs' first");
}

TEST_CASE("listing analysis: pages of a fetched list join in order, a gap ends the list, replays replace") {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  Store& store = *opened.value();
  AuditedWrite w(store, "fetch");
  auto listing = [&](int page, const std::vector<std::string>& items, const char* extraction = "ok") {
    store.Prepare("INSERT INTO listing(source, query, location, page, fetched_at, extraction, audit_seq) "
                  "VALUES ('board', 'clerk', 'Orlinde', ?1, 'x', ?2, ?3)")
        .Bind(1, static_cast<int64_t>(page))
        .Bind(2, extraction)
        .Bind(3, w.seq())
        .Run();
    int64_t id = store.LastInsertId();
    for (size_t p = 0; p < items.size(); ++p)
      store.Prepare("INSERT INTO listing_item(listing_id, position, item_key, audit_seq) VALUES (?1, ?2, ?3, ?4)")
          .Bind(1, id)
          .Bind(2, static_cast<int64_t>(p + 1))
          .Bind(3, items[p])
          .Bind(4, w.seq())
          .Run();
    return id;
  };
  listing(2, {"c", "d"});                     // page 2 stored first: order comes from the page number
  int64_t old_page1 = listing(1, {"x", "y"});  // replaced below
  int64_t new_page1 = listing(1, {"a", "b"});
  store.Prepare("INSERT INTO listing_replay(listing_id, replaces, audit_seq) VALUES (?1, ?2, ?3)")
      .Bind(1, new_page1)
      .Bind(2, old_page1)
      .Bind(3, w.seq())
      .Run();
  listing(4, {"e"});  // page 3 is missing: e's place is unknown
  for (const char* item : {"a", "b", "c", "d", "e", "x", "y"})
    store.Prepare("INSERT INTO item_label(item_key, factor, level, audit_seq) VALUES (?1, 'origin', ?2, ?3)")
        .Bind(1, item)
        .Bind(2, std::string(item) < "c" ? "inland" : "coastal")
        .Bind(3, w.seq())
        .Run();
  w.Commit("fetched");
  ListingOptions o;
  o.resamples = 9;
  auto r = AnalyzeListings(ReadListings(store), o);
  REQUIRE(r.ok());
  const ListingAudit& a = r.value();
  CHECK(a.listings == 1);
  CHECK(a.appearances == 4);  // a b (page 1), c d (page 2 at places 3 and 4)
  CHECK(Group(a, "origin=inland").mean_position == 1.5);
  CHECK(Group(a, "origin=coastal").mean_position == 3.5);
}
