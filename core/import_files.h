#pragma once
// The record of imported files (table import_file): a second import of the
// same bytes adds nothing. Used by every CSV import.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

// True when a file of `kind` ("outcomes", "pairs") with this SHA-256 was
// imported into the store before.
bool AlreadyImported(Store& store, const std::string& kind, const std::string& sha256);
// Records an imported file under audit entry `seq`.
void RecordImportFile(Store& store, int64_t seq, const std::string& kind, const std::string& sha256,
                      const std::string& path, int64_t rows_landed, int64_t rows_rejected);

// One imported file as the store recorded it: the path as given on the
// command line, the SHA-256 of its bytes and the rows it landed.
struct ImportedFile {
  std::string kind;  // "pairs" (also `import applications`), "outcomes", "sendings"
  std::string sha256;
  std::string path;
  int64_t rows_landed = 0;
  int64_t rows_rejected = 0;
};

// Every imported file in the order of import (empty when none).
std::vector<ImportedFile> ReadImportedFiles(Store& store);

}  // namespace twinprobe
