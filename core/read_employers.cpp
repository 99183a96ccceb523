#include "core/read_employers.h"

#include "core/store.h"

namespace twinprobe {

std::map<std::string, std::string> ReadEmployerNames(Store& store) {
  std::map<std::string, std::string> names;
  Stmt q = store.Prepare("SELECT key, name FROM employer WHERE name IS NOT NULL");
  while (q.Step()) names[q.Text(0)] = q.Text(1);
  return names;
}

}  // namespace twinprobe
