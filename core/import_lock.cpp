#include "core/import_lock.h"

#include <cerrno>
#include <cstring>

#include "core/audit.h"
#include "core/clock.h"

namespace twinprobe {

Result<ImportLock> AcquireImportLock(const std::string& store_path) {
  const std::string path = store_path + ".import-lock";
  ImportLock lock{LockedFile::Open(path)};
  if (!lock.file.is_open())
    return BadInput(path, std::string("cannot open the import lock: ") + std::strerror(errno),
                    "check that the study folder is writable and that this is not a link");
  if (!lock.file.TryLock()) {
    // The holder wrote when it started; one that has only just taken the
    // lock may not have written yet. (The CLI escapes the message for the
    // terminal.)
    std::string started = lock.file.Read();
    return BadInput(store_path,
                    "another import is running in this study (started " + (started.empty() ? "just now" : started) +
                        ")",
                    "try again when it ends");
  }
  if (!lock.file.Write(NowIso() + " by " + CurrentActor()))
    return BadInput(path, std::string("cannot write the import lock: ") + std::strerror(errno),
                    "check that the disk has space and the folder is writable");
  return lock;
}

}  // namespace twinprobe
