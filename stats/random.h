#pragma once
// A seeded random source whose stream is the same on every platform and
// compiler (std::uniform_int_distribution is not), so a seed reproduces a
// plan or a permutation test byte for byte. xoshiro256** (Blackman & Vigna
// 2018), seeded through splitmix64 as its authors recommend.
#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace twinprobe::stats {

class Rng {
 public:
  explicit Rng(uint64_t seed);
  uint64_t Next();
  // Uniform integer in [0, bound) without modulo bias (Lemire 2019). bound > 0.
  uint64_t Below(uint64_t bound);
  // Uniform integer in [lo, hi] (inclusive). Requires lo <= hi.
  int64_t Between(int64_t lo, int64_t hi);
  // Uniform double in [0, 1) with 53 random bits.
  double Uniform();
  bool Bernoulli(double p) { return Uniform() < p; }

  template <typename T>
  void Shuffle(std::vector<T>& v) {  // Fisher–Yates
    for (size_t i = v.size(); i > 1; --i) std::swap(v[i - 1], v[Below(i)]);
  }

 private:
  uint64_t s_[4];
};

}  // namespace twinprobe::stats
