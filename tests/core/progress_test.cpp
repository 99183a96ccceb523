#include <catch2/catch.hpp>

#include <cstdlib>
#include <sstream>
#include <thread>

#include "core/progress.h"

using namespace twinprobe;

TEST_CASE("progress: renders a bar with percent and human byte amounts") {
  CHECK(Progress::Render("importing a.csv", 1500000, 3000000, Progress::Unit::kBytes) ==
        "importing a.csv [############------------]  50%  1.5 MB of 3.0 MB");
  CHECK(Progress::Render("checking", 0, 10, Progress::Unit::kCount) == "checking [------------------------]   0%  0 of 10");
  CHECK(Progress::Render("checking", 12, 10, Progress::Unit::kCount) == "checking [########################] 100%  10 of 10");
  CHECK(Progress::Render("fetching", 7, 0, Progress::Unit::kCount) == "fetching  7");
  CHECK(Progress::Render("x", 999, 2000, Progress::Unit::kBytes) == "x [###########-------------]  49%  999 B of 2.0 kB");
}

TEST_CASE("progress: short work draws nothing, long work redraws in place and ends the line") {
  std::ostringstream quick_out;
  {
    Progress quick("quick", 100, Progress::Unit::kCount, &quick_out);
    for (int i = 0; i <= 100; ++i) quick.Update(i);
  }
  CHECK(quick_out.str().empty());

  std::ostringstream out;
  Progress slow("slow", 100, Progress::Unit::kCount, &out);
  slow.Update(10);
  std::this_thread::sleep_for(std::chrono::milliseconds(350));
  slow.Update(40);
  slow.Update(100);
  slow.Finish();
  slow.Finish();  // once only
  const std::string s = out.str();
  CHECK(s == "\rslow [#########---------------]  40%  40 of 100\rslow [########################] 100%  100 of 100\n");
}

TEST_CASE("progress: a total known late and a detail such as the URL being fetched") {
  setenv("TWINPROBE_PROGRESS_DELAY_MS", "0", 1);
  std::ostringstream out;
  {
    Progress bar("fetching", 0, Progress::Unit::kCount, &out);
    bar.SetTotal(4);
    bar.SetDetail("https://jobs.example/list?page=2");
    bar.Update(1);
  }  // the destructor finishes the line
  unsetenv("TWINPROBE_PROGRESS_DELAY_MS");
  CHECK(out.str() ==
        "\rfetching [######------------------]  25%  1 of 4  https://jobs.example/list?page=2"
        "\rfetching [######------------------]  25%  1 of 4  https://jobs.example/list?page=2\n");
}
