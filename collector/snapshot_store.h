#pragma once
// Raw fetched bodies kept as evidence: content-addressed files under the
// study's snapshots/ folder (docs/architecture.md: "snapshots/ (raw fetched pages,
// content-addressed)"). A body is stored once, at
//   snapshots/<first two hex digits>/<SHA-256 of the bytes, lower-case hex>
// written to a temporary file in the same folder, flushed to disk and renamed
// into place, so a reader never sees half a file. Files are never changed.
#include <string>
#include <string_view>

#include "core/status.h"

namespace twinprobe {

class SnapshotStore {
 public:
  explicit SnapshotStore(std::string dir) : dir_(std::move(dir)) {}

  // Stores `bytes` (if not there already) and returns their SHA-256.
  // Fails when the folder cannot be written.
  Result<std::string> Put(std::string_view bytes) const;
  // The bytes stored under `sha256`; fails if missing or if the file no
  // longer hashes to its name (a changed snapshot is reported, not used).
  Result<std::string> Get(const std::string& sha256) const;
  std::string PathOf(const std::string& sha256) const;
  const std::string& dir() const { return dir_; }

 private:
  std::string dir_;
};

}  // namespace twinprobe
