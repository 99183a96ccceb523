#pragma once
// The minimum interval between two requests to one host, kept across
// processes. FetchSession keeps it within one run; two `fetch` runs against
// one host at once each kept their own and together asked twice as often.
// Each host has a small file in a shared folder holding when the last request
// to it ended (wall clock, seconds); whoever wants the host locks that file
// (core/locked_file.h), waits out the interval, makes its request and writes
// the new end time before it lets go.
#include <functional>
#include <string>

#include "core/locked_file.h"

namespace twinprobe {

// A host's turn: held while a request is made.
class HostTurn {
 public:
  // Records now as the end of the last request to the host and lets go.
  // A turn dropped without Finish lets go without recording (nothing was
  // asked).
  void Finish();

 private:
  friend class HostPacing;
  LockedFile file_;
};

class HostPacing {
 public:
  // `dir` is created when needed; "" paces nothing (every turn is free).
  explicit HostPacing(std::string dir) : dir_(std::move(dir)) {}

  // Waits until no other process holds `authority` ("host:port") and
  // `interval_seconds` have passed since the last request to it ended, then
  // returns the turn. Polls every 50 ms; returns early (an empty turn) when
  // `cancelled` says so. A folder or file that cannot be used paces nothing
  // (the in-process interval still holds).
  HostTurn Take(const std::string& authority, double interval_seconds, const std::function<bool()>& cancelled);

 private:
  std::string dir_;
};

}  // namespace twinprobe
