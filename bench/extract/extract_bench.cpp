// bench/extract: extracting 10,000 stored listing pages with the fetch
// rules, compared in the same run with a bare Gumbo parse (parse + free, no
// extraction) of the same pages. Goal (issue 7): extraction at most 1.3x the
// bare parse. Pages are invented Veldmark Jobs Exchange result pages, written
// to a snapshot store in a temp folder and read back before timing, so both
// sides time the same in-memory bytes.
//
// Usage: extract_bench [PAGES]   (default 10000). Prints both times, the
// ratio, throughput and the process's peak resident memory.
#include <sys/resource.h>
#include <unistd.h>

#include <gumbo.h>

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "collector/extract.h"
#include "collector/snapshot_store.h"

using namespace twinprobe;

namespace {

const char* kGiven[] = {"Aldo", "Marit", "Joren", "Ilse", "Kemi", "Tavi", "Ilio", "Naya", "Brisa", "Arvel"};
const char* kFamily[] = {"Brenvik", "Olderhus", "Valtasz", "Karnwold", "Saralon", "Morunde", "Besquara", "Quelladi"};
const char* kTowns[] = {"Orlinde", "Brakkeport", "Tessvale"};

// A result page of 20 candidates with the clutter of a real board: a
// header, navigation, a filter form, inline script, a footer.
std::string Page(uint64_t n) {
  uint64_t x = n * 6364136223846793005ULL + 1442695040888963407ULL;
  auto next = [&x] {
    x ^= x >> 33;
    x *= 0xff51afd7ed558ccdULL;
    x ^= x >> 33;
    return x;
  };
  std::string p =
      "<!DOCTYPE html><html lang=en><head><meta charset=utf-8><title>Candidates - Veldmark Jobs Exchange "
      "(invented)</title><style>.card{margin:4px}</style><script>var page=" + std::to_string(n) +
      ";</script></head><body><header><nav><a href=/>Home</a> <a href=/search>Search</a> <a href=/help>Help</a></nav>"
      "<form class=filters><input name=q value=clerk><select name=where><option>Orlinde<option>Brakkeport"
      "<option>Tessvale</select><button>Search</button></form></header><main><h1>Candidates</h1>"
      "<ol id=results class=ranked>\n";
  for (int i = 0; i < 20; ++i) {
    uint64_t r = next();
    std::string key = "vjx-" + std::to_string(1000 + r % 9000);
    p += "<li class=\"candidate card\" data-candidate=\"" + key + "\"><div class=head><h3 class=name>" +
         kGiven[(r >> 16) % 10] + " " + kFamily[(r >> 24) % 8] + "</h3><span class=town>" + kTowns[(r >> 32) % 3] +
         "</span></div>";
    if ((r >> 40) % 4) p += "<span class=salary>" + std::to_string(2400 + 50 * ((r >> 44) % 30)) + " VMK</span>";
    p += "<p class=summary>Experienced in stock control, forklift licence, available from next month. "
         "References on request.</p><a class=profile href=\"/c/" + key + "\">Profile</a></li>\n";
  }
  p += "</ol><p class=pager><a href=?page=2>Next</a></p></main><footer><p>Every name on this board is invented."
       "</p></footer></body></html>\n";
  return p;
}

double Seconds(std::chrono::steady_clock::duration d) { return std::chrono::duration<double>(d).count(); }

}  // namespace

int main(int argc, char** argv) {
  const int pages = argc > 1 ? std::atoi(argv[1]) : 10000;
  std::string dir = (std::filesystem::temp_directory_path() / ("twinprobe-bench-extract-" + std::to_string(getpid()))).string();
  SnapshotStore store(dir);
  std::vector<std::string> shas;
  for (int i = 0; i < pages; ++i) shas.push_back(store.Put(Page(static_cast<uint64_t>(i))).value());
  std::vector<std::string> bodies;
  size_t bytes = 0;
  for (const auto& sha : shas) {
    bodies.push_back(store.Get(sha).value());
    bytes += bodies.back().size();
  }
  std::filesystem::remove_all(dir);

  Source source;
  source.list_selector = "ol#results";
  source.item_selector = "li.candidate";
  source.item_key = "id";
  source.fields = {{"id", "@data-candidate", false, {}},
                   {"name", "h3.name", false, {}},
                   {"town", ".town", false, {}},
                   {"profile", "a.profile @href", false, {}},
                   {"salary", ".salary", true, {}}};
  ListingRules rules = CompileRules(source, "bench").value();

  // Alternate the two loops three times and keep each one's best, so
  // frequency scaling and other load on the machine hit both alike.
  double best_bare = 1e30, best_extract = 1e30;
  size_t items = 0;
  for (int round = 0; round < 3; ++round) {
    auto t0 = std::chrono::steady_clock::now();
    for (const auto& b : bodies) {
      GumboOutput* out = gumbo_parse_with_options(&kGumboDefaultOptions, b.data(), b.size());
      gumbo_destroy_output(&kGumboDefaultOptions, out);
    }
    auto t1 = std::chrono::steady_clock::now();
    items = 0;
    for (const auto& b : bodies) {
      Extraction x = ExtractListing(b, rules);
      if (!x.ok) {
        std::fprintf(stderr, "extraction failed: %s\n", x.error.c_str());
        return 1;
      }
      items += x.items.size();
    }
    auto t2 = std::chrono::steady_clock::now();
    best_bare = std::min(best_bare, Seconds(t1 - t0));
    best_extract = std::min(best_extract, Seconds(t2 - t1));
  }
  struct rusage ru {};
  getrusage(RUSAGE_SELF, &ru);
  double mb = static_cast<double>(bytes) / (1024.0 * 1024.0);
  std::printf("pages                 %d (%.1f MiB, %zu items extracted per pass)\n", pages, mb, items);
  std::printf("bare Gumbo parse      %.3f s  (%.0f pages/s, %.1f MiB/s)\n", best_bare, pages / best_bare, mb / best_bare);
  std::printf("ExtractListing        %.3f s  (%.0f pages/s, %.1f MiB/s)\n", best_extract, pages / best_extract,
              mb / best_extract);
  std::printf("ratio                 %.3f  (goal <= 1.3)\n", best_extract / best_bare);
  std::printf("peak resident memory  %.0f MiB\n", ru.ru_maxrss / 1024.0);
  return best_extract / best_bare <= 1.3 ? 0 : 1;
}
