#pragma once
// Which study files the desk may serve: only regular files under the study's
// materials/ and reports/ folders, named without "..", "." or hidden parts,
// reached without a symbolic link anywhere on the way, and at most
// kMaxServedBytes long.
#include <cstdint>
#include <string>

#include "core/status.h"

namespace twinprobe {

constexpr int64_t kMaxServedBytes = 32 * 1024 * 1024;

struct ServedFile {
  std::string path;          // on disk
  std::string content_type;  // from the extension
};

// Resolves a URL path "/files/materials/P00001.html" (already percent-decoded)
// inside `study_dir`. Errors (bad input) say why the file cannot be served.
Result<ServedFile> ResolveStudyFile(const std::string& study_dir, const std::string& url_path);

}  // namespace twinprobe
