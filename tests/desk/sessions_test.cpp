// desk/sessions.h: session expiry and the sign-in brake.
#include "desk/sessions.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("desk sessions: a session ends after 30 idle minutes or 12 hours, whichever comes first") {
  SessionTable t;
  const std::string id = t.Start("Ada Moss", 1000);
  REQUIRE(id.size() == 64);
  auto s = t.Find(id, 1000 + 29 * 60);
  REQUIRE(s);
  CHECK(s->member == "Ada Moss");
  CHECK(s->csrf.size() == 64);
  CHECK(s->csrf != id);
  CHECK_FALSE(t.Find(id, 1000 + 29 * 60 + 30 * 60 + 1));  // idle too long
  CHECK_FALSE(t.Find(id, 1000));                          // and forgotten

  const std::string busy = t.Start("Bo Lind", 0);
  int64_t now = 0;
  for (; now < 12 * 3600; now += 20 * 60) REQUIRE(t.Find(busy, now));  // never idle
  CHECK_FALSE(t.Find(busy, 12 * 3600 + 1));                            // but not forever

  const std::string ended = t.Start("Bo Lind", 0);
  t.End(ended);
  CHECK_FALSE(t.Find(ended, 1));
  CHECK_FALSE(t.Find("not-a-session", 1));
}

TEST_CASE("desk throttle: each wrong passphrase doubles the wait, up to 15 minutes, and a success resets it") {
  SignInThrottle t;
  CHECK(t.WaitSeconds("Ada Moss", 100) == 0);
  t.Failed("Ada Moss", 100);
  CHECK(t.WaitSeconds("Ada Moss", 100) == 1);
  CHECK(t.WaitSeconds("Ada Moss", 101) == 0);
  t.Failed("Ada Moss", 101);
  CHECK(t.WaitSeconds("Ada Moss", 101) == 2);
  t.Failed("Ada Moss", 103);
  CHECK(t.WaitSeconds("Ada Moss", 103) == 4);
  CHECK(t.WaitSeconds("Bo Lind", 103) == 0);  // per member
  for (int i = 0; i < 20; ++i) t.Failed("Ada Moss", 200);
  CHECK(t.WaitSeconds("Ada Moss", 200) == 15 * 60);
  t.Succeeded("Ada Moss");
  CHECK(t.WaitSeconds("Ada Moss", 200) == 0);
}
