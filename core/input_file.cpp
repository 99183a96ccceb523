#include "core/input_file.h"

#include <sys/stat.h>

namespace twinprobe {

Status CheckRegularInput(const std::string& path) {
  struct stat st {};
  if (::stat(path.c_str(), &st) != 0 || S_ISREG(st.st_mode)) return {};
  const char* kind = S_ISDIR(st.st_mode)    ? "a folder"
                     : S_ISFIFO(st.st_mode) ? "a FIFO (named pipe)"
                     : S_ISCHR(st.st_mode) || S_ISBLK(st.st_mode) ? "a device"
                                                                  : "not a regular file";
  return BadInput(path, std::string("is ") + kind + ", not a file that can be read to its end",
                  "give a regular file, e.g. a CSV saved to disk");
}

}  // namespace twinprobe
