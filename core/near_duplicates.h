#pragma once
// Values that differ only in case or spaces ("Harbour coast", "Harbour
// Coast", "Harbour coast "): each spelling would silently form a stratum,
// an employer or an arm of its own. One tally, used by `import pairs` and by
// the vacancies file reader of `check` and `plan`; the command warns with
// both spellings and their counts.
#include <cstdint>
#include <map>
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

struct Spelling {
  std::string text;
  int64_t count = 0;  // rows (or vacancies) that hold it
};

// Two or more spellings of one column that are the same value once case and
// spaces are set aside, most frequent first (ties: first seen first).
struct NearDuplicate {
  std::string column;
  std::vector<Spelling> spellings;
};

// The key two spellings share when they are near duplicates: ASCII lower
// case, leading and trailing white space removed, inner runs of white space
// as one space.
std::string SpellingKey(std::string_view value);

// Counts values column by column, in the order they are added.
class SpellingTally {
 public:
  // Adds `count` rows holding `value` in `column`.
  void Add(const std::string& column, const std::string& value, int64_t count = 1);
  // Every group of near duplicates, columns in the order first added, groups
  // in the order their first spelling was seen. Empty when there are none.
  std::vector<NearDuplicate> NearDuplicates() const;

 private:
  struct Column {
    std::string name;
    std::vector<Spelling> values;           // distinct spellings, first seen first
    std::map<std::string, size_t> index;    // spelling -> values[i]
  };
  std::vector<Column> columns_;
  std::map<std::string, size_t> column_index_;
};

}  // namespace twinprobe
