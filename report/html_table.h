#pragma once
// HTML data tables for the report: every chart has one beside it, and the
// design and results sections are mostly tables. Cell text is escaped and
// isolated (report/html_escape.h) unless a cell carries ready-made markup.
#include <string>
#include <vector>

namespace twinprobe {

struct TableCell {
  std::string text;     // plain text, escaped on output
  bool numeric = false; // right-aligned, tabular figures
  std::string html;     // when non-empty, used as is instead of `text` (caller escapes)
  bool row_header = false;  // rendered as <th scope="row">
};

struct HtmlTable {
  std::string caption;               // plain text
  std::vector<std::string> headers;  // plain text column headers
  std::vector<std::vector<TableCell>> rows;
  std::string css_class;             // extra class on <table>
};

// Shorthands for cells.
TableCell Cell(std::string text);
TableCell NumCell(std::string text);
TableCell HeadCell(std::string text);
TableCell HtmlCell(std::string html, bool numeric = false);

std::string RenderTable(const HtmlTable& table);

}  // namespace twinprobe
