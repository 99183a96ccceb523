// collector/import_ranks.h at the store level (the command end to end is in
// tests/cli/ranks_cli_test.cpp).
#include "collector/import_ranks.h"

#include <catch2/catch.hpp>

#include "testing/testing.h"

using namespace twinprobe;

namespace {

std::unique_ptr<Store> OpenStore(const testing::TempDir& dir) {
  auto store = Store::Open(dir / "study.db", true);
  REQUIRE(store.ok());
  return std::move(store.value());
}

const char* kRanks =
    "listing,query,location,position,item,origin\n"
    "L1,clerk,Orlinde,1,a,inland\n"
    "L1,clerk,Orlinde,2,b,coastal\n"
    "L2,clerk,Tessvale,1,b,coastal\n";

}  // namespace

TEST_CASE("import ranks module: a file lands once, with its progress reported per list") {
  testing::TempDir dir;
  testing::WriteFile(dir / "ranks.csv", kRanks);
  auto store = OpenStore(dir);
  std::vector<std::pair<int64_t, int64_t>> calls;
  auto r = ImportRanksFile(*store, dir / "ranks.csv", [&](int64_t done, int64_t total) { calls.emplace_back(done, total); });
  REQUIRE(r.ok());
  CHECK(r.value().listings == 2);
  CHECK(r.value().positions == 3);
  CHECK(r.value().labels_added == 2);
  CHECK(r.value().strata == 2);
  CHECK(r.value().factors == std::vector<std::string>{"origin"});
  CHECK(calls == std::vector<std::pair<int64_t, int64_t>>{{2, 3}, {3, 3}});
  CHECK(store->QueryInt("SELECT count(*) FROM listing WHERE page IS NULL AND source = 'import'") == 2);

  auto again = ImportRanksFile(*store, dir / "ranks.csv");
  REQUIRE(again.ok());
  CHECK(again.value().already_imported);
  CHECK(store->QueryInt("SELECT count(*) FROM listing") == 2);
  CHECK(store->QueryInt("SELECT count(*) FROM audit") == 1);
}

TEST_CASE("import ranks module: an item regrouped against the store is refused and nothing lands") {
  testing::TempDir dir;
  testing::WriteFile(dir / "ranks.csv", kRanks);
  testing::WriteFile(dir / "later.csv", "listing,position,item,origin\nL3,1,a,coastal\n");
  auto store = OpenStore(dir);
  REQUIRE(ImportRanksFile(*store, dir / "ranks.csv").ok());
  auto r = ImportRanksFile(*store, dir / "later.csv");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() ==
        dir / "later.csv" +
            ": item a is origin=inland in the store (audit entry 1) but origin=coastal in this file \u2014 an item "
            "keeps its group here; use a new item key, or correct the label with 'twinprobe import labels'");
  CHECK(store->QueryInt("SELECT count(*) FROM listing") == 2);
  CHECK(store->QueryInt("SELECT count(*) FROM audit") == 1);
}

TEST_CASE("import ranks module: a bad file is refused before any store is touched") {
  testing::TempDir dir;
  testing::WriteFile(dir / "ranks.csv", "listing,position,item,origin\nL1,0,a,inland\n");
  auto r = ReadRanksFile(dir / "ranks.csv");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() == dir / "ranks.csv" +
                                   ":2: position '0' is not a whole number from 1 to 1000000 \u2014 write the place "
                                   "in the list, 1 for the top");
}
