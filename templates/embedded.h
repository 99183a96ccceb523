#pragma once
// The demo study's files, embedded at build time from templates/demo/.
#include <string_view>
#include <vector>

namespace twinprobe {

struct EmbeddedFile {
  std::string_view path;     // relative to the study folder, '/'-separated
  std::string_view content;
};

// Every file of the invented demo study, sorted by path.
const std::vector<EmbeddedFile>& DemoStudyFiles();

}  // namespace twinprobe
