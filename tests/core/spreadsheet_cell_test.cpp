#include "core/spreadsheet_cell.h"

#include <catch2/catch.hpp>

using twinprobe::LooksLikeFormula;
using twinprobe::NeutraliseCell;

TEST_CASE("spreadsheet cell: cells beginning with = + - @ tab or CR get a leading quote") {
  CHECK(NeutraliseCell("=HYPERLINK(\"http://example.invalid\",\"open\")") ==
        "'=HYPERLINK(\"http://example.invalid\",\"open\")");
  CHECK(NeutraliseCell("+1+1") == "'+1+1");
  CHECK(NeutraliseCell("-2+3") == "'-2+3");
  CHECK(NeutraliseCell("@SUM(A1:A2)") == "'@SUM(A1:A2)");
  CHECK(NeutraliseCell("\t=1") == "'\t=1");
  CHECK(NeutraliseCell("\r=1") == "'\r=1");
}

TEST_CASE("spreadsheet cell: other cells are unchanged") {
  CHECK(NeutraliseCell("") == "");
  CHECK(NeutraliseCell("P00001") == "P00001");
  CHECK(NeutraliseCell("a=b") == "a=b");
  CHECK(NeutraliseCell("'quoted") == "'quoted");
  CHECK(NeutraliseCell(" =1") == " =1");
  CHECK_FALSE(LooksLikeFormula("2027-03-05"));
  CHECK(LooksLikeFormula("-"));
}
