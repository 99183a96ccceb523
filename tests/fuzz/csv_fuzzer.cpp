// Fuzzes the RFC 4180 reader: any bytes give records or one positioned
// error; a record never has zero fields; reading always terminates.
#include <cstddef>
#include <cstdint>
#include <sstream>
#include <string>

#include "core/csv.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  std::string text(reinterpret_cast<const char*>(data), size);
  std::istringstream in(text);
  twinprobe::CsvReader reader(in, "fuzz.csv");
  twinprobe::CsvRecord rec;
  size_t records = 0;
  while (reader.Next(rec)) {
    if (rec.fields.empty()) __builtin_trap();
    if (++records > size + 1) __builtin_trap();  // more records than bytes: a loop that does not advance
  }
  if (reader.error() && reader.error()->where.rfind("fuzz.csv:", 0) != 0) __builtin_trap();
  return 0;
}
