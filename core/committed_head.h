#pragma once
// The chain head this process last committed. Every command that writes does
// so through AuditedWrite (core/audit.h); the CLI prints the head once after
// the command, in one place, so that it can be kept outside the store (a
// witness's copy is what `verify --head` checks against).
#include <string>

namespace twinprobe {

// The hash of the newest audit entry committed by this process, or "" when
// it committed none. A command that commits several entries (demo) leaves
// the last one's.
std::string LastCommittedHead();

}  // namespace twinprobe
