#include "collector/mail_html.h"

#include <gumbo.h>

#include "collector/html_bounds.h"

namespace twinprobe {
namespace {

bool IsBlock(GumboTag tag) {
  switch (tag) {
    case GUMBO_TAG_P:
    case GUMBO_TAG_DIV:
    case GUMBO_TAG_LI:
    case GUMBO_TAG_TR:
    case GUMBO_TAG_H1:
    case GUMBO_TAG_H2:
    case GUMBO_TAG_H3:
    case GUMBO_TAG_H4:
    case GUMBO_TAG_H5:
    case GUMBO_TAG_H6:
    case GUMBO_TAG_UL:
    case GUMBO_TAG_OL:
    case GUMBO_TAG_TABLE:
    case GUMBO_TAG_BLOCKQUOTE:
    case GUMBO_TAG_PRE:
    case GUMBO_TAG_HR:
    case GUMBO_TAG_SECTION:
    case GUMBO_TAG_ARTICLE:
    case GUMBO_TAG_HEADER:
    case GUMBO_TAG_FOOTER:
    case GUMBO_TAG_ADDRESS:
    case GUMBO_TAG_DL:
    case GUMBO_TAG_DT:
    case GUMBO_TAG_DD:
      return true;
    default:
      return false;
  }
}

// Accumulates lines; knows whether it stands at the start of a line so the
// quote prefix and space collapsing come out right.
class TextSink {
 public:
  void Text(const char* text, bool preformatted) {
    for (const char* p = text; *p; ++p) {
      char c = *p;
      if (preformatted && c == '\n') {
        Break();
        continue;
      }
      if (!preformatted && (c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f')) {
        pending_space_ = !at_line_start_;
        continue;
      }
      if (at_line_start_) {
        for (int k = 0; k < quote_depth_; ++k) out_ += "> ";
        at_line_start_ = false;
      } else if (pending_space_) {
        out_ += ' ';
      }
      pending_space_ = false;
      out_ += c;
    }
  }
  // Ends the current line (block boundaries).
  void EndLine() {
    if (at_line_start_) return;
    out_ += '\n';
    at_line_start_ = true;
    pending_space_ = false;
  }
  // A <br> or a newline in <pre>: a line break even on an empty line, but
  // never more than one empty line in a row.
  void Break() {
    if (out_.size() < 2 || out_.compare(out_.size() - 2, 2, "\n\n") != 0) out_ += '\n';
    at_line_start_ = true;
    pending_space_ = false;
  }
  void Quote(int delta) { quote_depth_ += delta; }
  std::string Take() {
    while (!out_.empty() && out_.back() == '\n') out_.pop_back();
    return out_;
  }

 private:
  std::string out_;
  bool at_line_start_ = true;
  bool pending_space_ = false;
  int quote_depth_ = 0;
};

void Walk(const GumboNode* node, TextSink& sink, bool pre) {
  switch (node->type) {
    case GUMBO_NODE_TEXT:
    case GUMBO_NODE_CDATA:
    case GUMBO_NODE_WHITESPACE:
      sink.Text(node->v.text.text, pre);
      return;
    case GUMBO_NODE_DOCUMENT:
      for (unsigned i = 0; i < node->v.document.children.length; ++i)
        Walk(static_cast<const GumboNode*>(node->v.document.children.data[i]), sink, pre);
      return;
    case GUMBO_NODE_ELEMENT:
    case GUMBO_NODE_TEMPLATE:
      break;
    default:
      return;  // comments
  }
  GumboTag tag = node->v.element.tag;
  if (tag == GUMBO_TAG_SCRIPT || tag == GUMBO_TAG_STYLE || tag == GUMBO_TAG_HEAD || tag == GUMBO_TAG_TITLE) return;
  if (tag == GUMBO_TAG_BR) {
    sink.Break();
    return;
  }
  bool block = IsBlock(tag);
  if (block) sink.EndLine();
  if (tag == GUMBO_TAG_BLOCKQUOTE) sink.Quote(1);
  if (tag == GUMBO_TAG_TD || tag == GUMBO_TAG_TH) sink.Text(" ", false);
  const GumboVector& kids = node->v.element.children;
  for (unsigned i = 0; i < kids.length; ++i)
    Walk(static_cast<const GumboNode*>(kids.data[i]), sink, pre || tag == GUMBO_TAG_PRE);
  if (tag == GUMBO_TAG_BLOCKQUOTE) {
    sink.EndLine();
    sink.Quote(-1);
  }
  if (block) sink.EndLine();
}

}  // namespace

std::string HtmlToText(std::string_view html) {
  const GumboOptions options = BoundedGumboOptions();
  GumboOutput* out = gumbo_parse_with_options(&options, html.data(), html.size());
  TextSink sink;
  // Beyond the depth cap the text is not walked (recursively): the mail's
  // body digest is sealed as usual; the text says why it is not shown.
  if (HtmlTreeDepth(out->document) > kMaxHtmlDepth)
    sink.Text(("[this HTML part nests elements deeper than " + std::to_string(kMaxHtmlDepth) +
               " levels and was not read]").c_str(),
              false);
  else
    Walk(out->document, sink, false);
  gumbo_destroy_output(&options, out);
  return sink.Take();
}

}  // namespace twinprobe
