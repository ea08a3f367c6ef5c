// Internal to present: a report as a plain tree of sections and blocks, written out as HTML or
// Markdown by one writer each, so both forms say the same thing in the same order.
#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace plumb::present::report {

struct Table {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  std::vector<bool> code;  // columns shown in a fixed-width face (names, formulas, hashes)
};

// Text in blocks may mark code spans with backticks, as Markdown does; nothing else is markup.
struct Block {
  enum class Kind {
    paragraph,    // text
    subheading,   // text
    table,        // table
    figure,       // svg beside its text equivalent, the table; text is the caption
    code,         // text, verbatim
    list,         // items
    collapsible,  // text is the summary; children inside; open when `open`
    callout,      // text, set apart: the status of the result, the cautions
  };
  Kind kind = Kind::paragraph;
  std::string text;
  Table table;
  std::string svg;
  std::vector<std::string> items;
  std::vector<Block> children;
  bool open = false;
  std::string id;  // an anchor for code blocks that tests and readers look for
};

struct Section {
  std::string id;
  std::string title;
  std::vector<Block> blocks;
};

struct Document {
  std::string title;
  std::string subtitle;
  std::vector<Section> sections;
};

void write_html(const Document& document, std::ostream& out);
void write_markdown(const Document& document, std::ostream& out);

// Block constructors, for short building code.
Block paragraph(std::string text);
Block subheading(std::string text);
Block table(Table table);
Block figure(std::string caption, std::string svg, Table text_equivalent);
Block code(std::string text, std::string id = {});
Block list(std::vector<std::string> items);
Block collapsible(std::string summary, std::vector<Block> children, bool open);
Block callout(std::string text);

}  // namespace plumb::present::report
