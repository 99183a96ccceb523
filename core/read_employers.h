#pragma once
// Employer names by pseudonym, for a report the user asked to reveal them in
// (`report --reveal-employers`, recorded in the audit chain first). Empty
// after `purge`.
#include <map>
#include <string>

namespace twinprobe {

class Store;

std::map<std::string, std::string> ReadEmployerNames(Store& store);

}  // namespace twinprobe
