#pragma once
// Fixtures shared by the collector tests (header-only: tests/CMakeLists.txt
// builds *_test.cpp and testing/*.cpp). Real stores in temp folders, made by
// the real binary where a planned study is needed.
#include <catch2/catch.hpp>

#include <memory>
#include <string>

#include "core/audit.h"
#include "core/schema.h"
#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

namespace twinprobe::testing {

// A study folder made by `twinprobe init` and `twinprobe plan` (the invented
// Veldmark demo design: 400 vacancies, 800 probes P00001..P00800), with the
// clock pinned at the end of its 2027 season (fieldwork times may not lie in
// the future) unless a test pins its own.
struct PlannedStudy {
  PinnedClock clock;
  TempDir dir;
  std::string path;
  explicit PlannedStudy(bool plan = true) : path(dir / "study") {
    REQUIRE(RunCli({"--study", path, "init"}).exit_code == 0);
    if (plan) {
      auto r = RunCli({"--study", path, "plan"});
      INFO(r.err);
      REQUIRE(r.exit_code == 0);
    }
  }
  std::string db() const { return path + "/study.db"; }
  std::unique_ptr<Store> Open() const {
    auto s = Store::Open(db(), false);
    REQUIRE(s.ok());
    return std::move(s).value();
  }
};

// Row counts of every sealed table and the audit head: equal fingerprints
// mean nothing was added, changed or removed.
inline std::string Fingerprint(Store& store) {
  std::string f;
  for (const SealedTable& t : SealedTables())
    f += t.name + "=" + std::to_string(store.QueryInt("SELECT count(*) FROM \"" + t.name + "\"")) + " ";
  f += "employer=" + std::to_string(store.QueryInt("SELECT count(*) FROM employer")) + " ";
  f += "audit=" + std::to_string(store.QueryInt("SELECT count(*) FROM audit")) + " head=" + AuditHead(store);
  return f;
}

inline std::string FingerprintOf(const std::string& db) {
  auto s = Store::Open(db, false);
  REQUIRE(s.ok());
  return Fingerprint(*s.value());
}

}  // namespace twinprobe::testing
