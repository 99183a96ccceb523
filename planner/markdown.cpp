#include "planner/markdown.h"

#include <cctype>
#include <cstring>

#include "core/text.h"

namespace twinprobe {
namespace {

constexpr std::string_view kEscapable = "\\*_#-+.`[]";
// What a value needs escaped inside a line of Markdown.
constexpr std::string_view kValueEscapes = "\\*_`[]";

struct Block {
  enum Kind { kParagraph, kHeading, kBullet, kNumbered, kRule } kind = kParagraph;
  int level = 0;               // heading level, or the item's number
  std::vector<std::string> lines;
};

std::vector<Block> ParseBlocks(std::string_view md) {
  std::vector<Block> blocks;
  bool in_paragraph = false;
  size_t pos = 0;
  while (pos <= md.size()) {
    size_t end = md.find('\n', pos);
    if (end == std::string_view::npos) end = md.size();
    std::string_view raw = md.substr(pos, end - pos);
    pos = end + 1;
    std::string_view line = Trim(raw);
    if (line.empty()) {
      in_paragraph = false;
      if (end == md.size()) break;
      continue;
    }
    size_t hashes = 0;
    while (hashes < line.size() && line[hashes] == '#') ++hashes;
    if (hashes >= 1 && hashes <= 6 && hashes < line.size() && line[hashes] == ' ') {
      blocks.push_back({Block::kHeading, static_cast<int>(hashes), {std::string(Trim(line.substr(hashes)))}});
      in_paragraph = false;
    } else if (line == "---" || line == "***" || line == "___") {
      blocks.push_back({Block::kRule, 0, {}});
      in_paragraph = false;
    } else if (line.size() >= 2 && (line[0] == '-' || line[0] == '*' || line[0] == '+') && line[1] == ' ') {
      blocks.push_back({Block::kBullet, 0, {std::string(Trim(line.substr(2)))}});
      in_paragraph = false;
    } else if (size_t digits = line.find_first_not_of("0123456789");
               digits > 0 && digits != std::string_view::npos && digits + 1 < line.size() && line[digits] == '.' &&
               line[digits + 1] == ' ') {
      blocks.push_back({Block::kNumbered, std::atoi(std::string(line.substr(0, digits)).c_str()),
                        {std::string(Trim(line.substr(digits + 2)))}});
      in_paragraph = false;
    } else if (in_paragraph) {
      blocks.back().lines.emplace_back(line);
    } else {
      blocks.push_back({Block::kParagraph, 0, {std::string(line)}});
      in_paragraph = true;
    }
    if (end == md.size()) break;
  }
  return blocks;
}

// Inline markup to HTML or text. Tokens become their values (escaped for HTML).
std::string Inline(std::string_view s, const std::vector<std::string>& values, bool html) {
  std::string out;
  bool strong = false, em = false;
  char em_marker = 0;
  // A marker only opens when it has a matching closer later on the line.
  auto closes_later = [&](size_t from, std::string_view marker) { return s.find(marker, from) != std::string_view::npos; };
  for (size_t i = 0; i < s.size(); ++i) {
    char c = s[i];
    if (c == '\x01') {
      size_t end = s.find('\x02', i);
      size_t index = static_cast<size_t>(std::atoi(std::string(s.substr(i + 1, end - i - 1)).c_str()));
      const std::string& v = index < values.size() ? values[index] : std::string();
      out += html ? HtmlEscape(v) : v;
      i = end;
      continue;
    }
    if (c == '\\' && i + 1 < s.size() && kEscapable.find(s[i + 1]) != std::string_view::npos) {
      std::string lit(1, s[++i]);
      out += html ? HtmlEscape(lit) : lit;
      continue;
    }
    if (c == '*' && i + 1 < s.size() && s[i + 1] == '*' && (strong || closes_later(i + 2, "**"))) {
      if (html) out += strong ? "</strong>" : "<strong>";
      strong = !strong;
      ++i;
      continue;
    }
    if ((c == '*' || c == '_') && (em ? em_marker == c : closes_later(i + 1, std::string_view(&c, 1)))) {
      // '_' inside a word (snake_case) is text, as in common Markdown.
      bool inner_word = c == '_' && i > 0 && std::isalnum(static_cast<unsigned char>(s[i - 1])) &&
                        i + 1 < s.size() && std::isalnum(static_cast<unsigned char>(s[i + 1]));
      if (!inner_word) {
        if (html) out += em ? "</em>" : "<em>";
        em = !em;
        em_marker = em ? c : 0;
        continue;
      }
    }
    std::string lit(1, c);
    out += html ? HtmlEscape(lit) : lit;
  }
  if (html) {
    if (em) out += "</em>";
    if (strong) out += "</strong>";
  }
  return out;
}

size_t DisplayWidth(const std::string& s) {
  size_t n = 0;
  for (unsigned char c : s) n += (c & 0xC0) != 0x80;
  return n;
}

}  // namespace

std::string HtmlEscape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string MarkdownToHtml(std::string_view md, const std::vector<std::string>& values) {
  auto blocks = ParseBlocks(md);
  std::string title, body;
  const char* open_list = nullptr;
  auto close_list = [&] {
    if (open_list) body += std::string("</") + open_list + ">\n";
    open_list = nullptr;
  };
  for (const auto& b : blocks) {
    if (b.kind != Block::kBullet && b.kind != Block::kNumbered) close_list();
    switch (b.kind) {
      case Block::kHeading: {
        std::string h = std::to_string(b.level);
        if (title.empty()) title = Inline(b.lines[0], values, true);
        body += "<h" + h + ">" + Inline(b.lines[0], values, true) + "</h" + h + ">\n";
        break;
      }
      case Block::kRule: body += "<hr>\n"; break;
      case Block::kBullet:
      case Block::kNumbered: {
        const char* tag = b.kind == Block::kBullet ? "ul" : "ol";
        if (!open_list || std::strcmp(open_list, tag) != 0) {
          close_list();
          body += std::string("<") + tag + ">\n";
          open_list = tag;
        }
        body += "<li>" + Inline(b.lines[0], values, true) + "</li>\n";
        break;
      }
      case Block::kParagraph: {
        std::string joined;
        for (size_t i = 0; i < b.lines.size(); ++i) joined += (i ? "\n" : "") + b.lines[i];
        body += "<p>" + Inline(joined, values, true) + "</p>\n";
        break;
      }
    }
  }
  close_list();
  return "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" + title +
         "</title>\n</head>\n<body>\n" + body + "</body>\n</html>\n";
}

std::string MarkdownToText(std::string_view md, const std::vector<std::string>& values) {
  auto blocks = ParseBlocks(md);
  std::string out;
  Block::Kind previous = Block::kRule;
  bool first = true;
  for (const auto& b : blocks) {
    bool in_list = (b.kind == Block::kBullet || b.kind == Block::kNumbered) && previous == b.kind;
    if (!first && !in_list) out += "\n";
    first = false;
    previous = b.kind;
    switch (b.kind) {
      case Block::kHeading: {
        std::string text = Inline(b.lines[0], values, false);
        out += text + "\n";
        if (b.level <= 2) out += std::string(DisplayWidth(text), b.level == 1 ? '=' : '-') + "\n";
        break;
      }
      case Block::kRule: out += "----------------------------------------\n"; break;
      case Block::kBullet: out += "- " + Inline(b.lines[0], values, false) + "\n"; break;
      case Block::kNumbered: out += std::to_string(b.level) + ". " + Inline(b.lines[0], values, false) + "\n"; break;
      case Block::kParagraph:
        for (const auto& l : b.lines) out += Inline(l, values, false) + "\n";
        break;
    }
  }
  return out;
}

std::string MarkdownWithValues(std::string_view md, const std::vector<std::string>& values) {
  std::string out;
  for (size_t i = 0; i < md.size(); ++i) {
    if (md[i] != '\x01') {
      out += md[i];
      continue;
    }
    size_t end = md.find('\x02', i);
    size_t index = static_cast<size_t>(std::atoi(std::string(md.substr(i + 1, end - i - 1)).c_str()));
    for (char c : index < values.size() ? values[index] : std::string())
      out += (kValueEscapes.find(c) != std::string_view::npos ? std::string("\\") : std::string()) + c;
    i = end;
  }
  return out;
}

}  // namespace twinprobe
