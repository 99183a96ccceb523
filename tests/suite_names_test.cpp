// CTest runs each Catch2 test by passing its name back as a filter
// (catch_discover_tests). CMake splits a name at ';', and the two halves then
// match nothing, so such a test silently never runs; 31 did until this check.
#include <catch2/catch.hpp>

#include <string>

TEST_CASE("test suite: every test name survives CTest's discovery") {
  const auto& tests = Catch::getRegistryHub().getTestCaseRegistry().getAllTests();
  REQUIRE(tests.size() > 100);
  for (const auto& test : tests) {
    const std::string& name = test.getTestCaseInfo().name;
    INFO(name);
    CHECK(name.find(';') == std::string::npos);
    CHECK(name.find('\n') == std::string::npos);
    CHECK(name.front() != ' ');
    CHECK(name.back() != ' ');
  }
}
