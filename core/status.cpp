#include "core/status.h"

namespace twinprobe {

std::string Error::Message() const {
  std::string m;
  if (!where.empty()) m += where + ": ";
  m += what;
  if (!fix.empty()) m += " \u2014 " + fix;
  return m;
}

ExitCode Error::exit_code() const {
  switch (kind) {
    case ErrorKind::kBadInput: return ExitCode::kBadInput;
    case ErrorKind::kUsage: return ExitCode::kUsage;
    case ErrorKind::kInternal: return ExitCode::kInternal;
  }
  return ExitCode::kInternal;
}

Error BadInput(std::string where, std::string what, std::string fix) {
  return Error{ErrorKind::kBadInput, std::move(where), std::move(what), std::move(fix)};
}

Error Internal(std::string what) { return Error{ErrorKind::kInternal, {}, std::move(what), {}}; }

}  // namespace twinprobe
