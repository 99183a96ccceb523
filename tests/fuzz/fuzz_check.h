#pragma once
// Invariant checks for the libFuzzer targets: a broken invariant prints what
// broke and traps, so libFuzzer saves the input as a crash artifact.
#include <cstdio>

#define FUZZ_CHECK(cond)                                                                       \
  do {                                                                                         \
    if (!(cond)) {                                                                             \
      std::fprintf(stderr, "fuzz invariant broken: %s (%s:%d)\n", #cond, __FILE__, __LINE__); \
      __builtin_trap();                                                                        \
    }                                                                                          \
  } while (0)
