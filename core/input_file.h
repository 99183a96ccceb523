#pragma once
// Files the tool reads must be regular files: /dev/zero never ends and a
// FIFO blocks until someone writes to it, so `import outcomes /dev/zero`
// would hang instead of failing. Checked with stat() before the file is
// opened (stat never blocks on a FIFO).
#include <string>

#include "core/status.h"

namespace twinprobe {

// OK when `path` is a regular file (a link to one counts) or does not exist
// (the reader's own "cannot read" message follows); a bad-input error naming
// `path` for a device, a FIFO, a socket or a folder.
Status CheckRegularInput(const std::string& path);

}  // namespace twinprobe
