#pragma once
// Errors as values. Every expected failure (bad input, missing file, a failed
// check) travels as a Status; exceptions never cross a module boundary.
#include <optional>
#include <string>
#include <utility>
#include <variant>

namespace twinprobe {

// Process exit codes (docs/architecture.md): 0 ok, 1 bad input or failed check, 2 usage, 3 internal.
enum class ExitCode { kOk = 0, kBadInput = 1, kUsage = 2, kInternal = 3 };

enum class ErrorKind { kBadInput, kUsage, kInternal };

// A failure with the place it points at. `where` is "FILE:LINE:COL" or
// "FILE:LINE" or empty; `what` says what is wrong; `fix` how to fix it.
struct Error {
  ErrorKind kind = ErrorKind::kBadInput;
  std::string where;
  std::string what;
  std::string fix;

  // "FILE:LINE:COL: what — fix" (parts that are empty are left out).
  std::string Message() const;
  ExitCode exit_code() const;
};

Error BadInput(std::string where, std::string what, std::string fix = {});
Error Internal(std::string what);

class Status {
 public:
  Status() = default;
  Status(Error e) : error_(std::move(e)) {}  // NOLINT: implicit by design
  bool ok() const { return !error_.has_value(); }
  const Error& error() const { return *error_; }

 private:
  std::optional<Error> error_;
};

template <typename T>
class Result {
 public:
  Result(T value) : v_(std::move(value)) {}  // NOLINT
  Result(Error e) : v_(std::move(e)) {}      // NOLINT
  bool ok() const { return std::holds_alternative<T>(v_); }
  const T& value() const& { return std::get<T>(v_); }
  T& value() & { return std::get<T>(v_); }
  T&& value() && { return std::get<T>(std::move(v_)); }
  const Error& error() const { return std::get<Error>(v_); }
  Status status() const { return ok() ? Status() : Status(error()); }

 private:
  std::variant<T, Error> v_;
};

}  // namespace twinprobe
