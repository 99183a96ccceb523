#pragma once
// The demo study's files and the ethics folder, embedded at build time
// from templates/demo/ and ethics/ (templates/CMakeLists.txt).
#include <string_view>
#include <vector>

namespace twinprobe {

struct EmbeddedFile {
  std::string_view path;     // relative to the study folder, '/'-separated
  std::string_view content;
};

// Every file of the invented demo study, sorted by path.
const std::vector<EmbeddedFile>& DemoStudyFiles();

// The ethics folder (protocol template, review checklist, letters,
// data-protection notes), paths starting "ethics/", sorted by path. `init`
// writes it into every new study folder, where messages point to its letters.
const std::vector<EmbeddedFile>& EthicsFiles();

}  // namespace twinprobe
