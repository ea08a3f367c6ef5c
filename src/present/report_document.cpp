// The two writers of a report document: self-contained HTML (inline CSS and SVG, a policy that
// forbids every fetch) and Markdown for version control (pictures as their text equivalents).
#include "report_document.hpp"

#include "svg.hpp"

#include <algorithm>
#include <ostream>

namespace plumb::present::report {
namespace {

// Plain, legible, high contrast: black on white, one accent for rules, tables ruled in full,
// numbered sections with a heavy rule above; widths in ems so A4 and Letter both fit.
constexpr const char* style = R"css(
:root { color: #000; background: #fff; }
body { font: 11pt/1.45 "DejaVu Sans", "Liberation Sans", sans-serif; max-width: 46em; margin: 2em auto;
  padding: 0 1.2em; }
header { border: 3px solid #000; padding: 0.8em 1em; margin-bottom: 1.6em; }
header h1 { font-size: 1.5em; margin: 0 0 0.2em 0; }
header p { margin: 0; }
nav ol { margin: 0.4em 0 0 0; padding-left: 1.6em; columns: 2; }
section { counter-increment: part; border-top: 4px solid #1d3f6e; margin-top: 1.8em; padding-top: 0.3em; }
h2 { font-size: 1.2em; margin: 0.2em 0 0.6em 0; }
h2::before { content: counter(part) ". "; }
h3 { font-size: 1em; margin: 1.2em 0 0.4em 0; }
table { border-collapse: collapse; width: 100%; margin: 0.4em 0 1em 0; font-size: 0.92em; }
th, td { border: 1px solid #000; padding: 0.25em 0.45em; text-align: left; vertical-align: top;
  overflow-wrap: break-word; }
th { background: #e8e8e8; }
code, pre, td.code { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 0.9em; }
pre { border: 1px solid #000; padding: 0.6em; white-space: pre-wrap; overflow-wrap: anywhere; }
.callout { border-left: 8px solid #000; background: #f2f2f2; padding: 0.6em 0.9em; margin: 0.8em 0; }
figure { margin: 0.6em 0 1.2em 0; }
figure svg { display: block; max-width: 100%; height: auto; border: 1px solid #000; }
figcaption { font-weight: bold; margin: 0.3em 0; }
details { border: 1px solid #000; padding: 0.3em 0.6em; margin: 0.6em 0; }
summary { font-weight: bold; }
@page { margin: 15mm; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 10pt; }
  nav { display: none; }
  section, figure, table, pre, .callout { break-inside: auto; }
  figure, .callout, tr { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
}
)css";

// Escapes text and turns `code` spans into <code> elements.
std::string inline_html(const std::string& text) {
  std::string out;
  bool in_code = false;
  std::size_t start = 0;
  for (std::size_t k = 0; k <= text.size(); ++k) {
    if (k < text.size() && text[k] != '`') continue;
    std::string piece = svg::escape(std::string_view(text).substr(start, k - start));
    out += piece;
    if (k < text.size()) out += in_code ? "</code>" : "<code>";
    in_code = k < text.size() ? !in_code : in_code;
    start = k + 1;
  }
  if (in_code) out += "</code>";
  return out;
}

void html_table(const Table& table, std::ostream& out) {
  out << "<table>";
  if (!table.header.empty()) {
    out << "<thead><tr>";
    for (const std::string& cell : table.header) out << "<th>" << inline_html(cell) << "</th>";
    out << "</tr></thead>";
  }
  out << "<tbody>\n";
  for (const auto& row : table.rows) {
    out << "<tr>";
    for (std::size_t k = 0; k < row.size(); ++k) {
      bool code = k < table.code.size() && table.code[k];
      out << (code ? "<td class=\"code\">" : "<td>") << (code ? svg::escape(row[k]) : inline_html(row[k])) << "</td>";
    }
    out << "</tr>\n";
  }
  out << "</tbody></table>\n";
}

void html_blocks(const std::vector<Block>& blocks, std::ostream& out) {
  for (const Block& block : blocks) {
    switch (block.kind) {
      case Block::Kind::paragraph: out << "<p>" << inline_html(block.text) << "</p>\n"; break;
      case Block::Kind::subheading: out << "<h3>" << inline_html(block.text) << "</h3>\n"; break;
      case Block::Kind::table: html_table(block.table, out); break;
      case Block::Kind::figure:
        out << "<figure><figcaption>" << inline_html(block.text) << "</figcaption>" << block.svg;
        out << "<p>In words and numbers (the same as the picture):</p>";
        html_table(block.table, out);
        out << "</figure>\n";
        break;
      case Block::Kind::code:
        out << "<pre" << (block.id.empty() ? "" : " id=\"" + svg::escape(block.id) + "\"") << ">"
            << svg::escape(block.text) << "</pre>\n";
        break;
      case Block::Kind::list:
        out << "<ul>";
        for (const std::string& item : block.items) out << "<li>" << inline_html(item) << "</li>";
        out << "</ul>\n";
        break;
      case Block::Kind::collapsible:
        out << "<details" << (block.open ? " open" : "") << "><summary>" << inline_html(block.text) << "</summary>\n";
        html_blocks(block.children, out);
        out << "</details>\n";
        break;
      case Block::Kind::callout: out << "<p class=\"callout\">" << inline_html(block.text) << "</p>\n"; break;
    }
  }
}

// A cell of a Markdown table: pipes escaped, line breaks flattened.
std::string markdown_cell(const std::string& text, bool code) {
  std::string out;
  for (char c : text) {
    if (c == '|') out += "\\|";
    else if (c == '\n' || c == '\r') out += ' ';
    else out += c;
  }
  if (code && !out.empty() && out.find('`') == std::string::npos) return "`" + out + "`";
  return out;
}

void markdown_table(const Table& table, std::ostream& out) {
  std::size_t width = table.header.size();
  for (const auto& row : table.rows) width = std::max(width, row.size());
  if (width == 0) return;
  auto row_line = [&](const std::vector<std::string>& row, bool header) {
    out << "|";
    for (std::size_t k = 0; k < width; ++k) {
      bool code = !header && k < table.code.size() && table.code[k];
      out << " " << (k < row.size() ? markdown_cell(row[k], code) : "") << " |";
    }
    out << "\n";
  };
  row_line(table.header.empty() ? std::vector<std::string>(width) : table.header, true);
  out << "|";
  for (std::size_t k = 0; k < width; ++k) out << "---|";
  out << "\n";
  for (const auto& row : table.rows) row_line(row, false);
  out << "\n";
}

void markdown_blocks(const std::vector<Block>& blocks, std::ostream& out, int level) {
  for (const Block& block : blocks) {
    switch (block.kind) {
      case Block::Kind::paragraph: out << block.text << "\n\n"; break;
      case Block::Kind::subheading: out << std::string(static_cast<std::size_t>(level), '#') << " " << block.text << "\n\n"; break;
      case Block::Kind::table: markdown_table(block.table, out); break;
      case Block::Kind::figure:
        out << "**" << block.text << "** (drawn in the HTML form; here its text equivalent)\n\n";
        markdown_table(block.table, out);
        break;
      case Block::Kind::code: {
        std::string fence = block.text.find("```") == std::string::npos ? "```" : "````";
        out << fence << "\n" << block.text << (block.text.ends_with("\n") ? "" : "\n") << fence << "\n\n";
        break;
      }
      case Block::Kind::list:
        for (const std::string& item : block.items) out << "- " << item << "\n";
        out << "\n";
        break;
      case Block::Kind::collapsible:
        out << std::string(static_cast<std::size_t>(level), '#') << " " << block.text << "\n\n";
        markdown_blocks(block.children, out, level + 1);
        break;
      case Block::Kind::callout: out << "> " << block.text << "\n\n"; break;
    }
  }
}

}  // namespace

void write_html(const Document& document, std::ostream& out) {
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
      // Nothing may be fetched: no scripts, fonts, images, frames or connections; only the inline style.
      << "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src 'unsafe-inline'; "
         "base-uri 'none'; form-action 'none'\">\n"
      << "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
      << "<title>" << svg::escape(document.title) << "</title>\n<style>" << style << "</style>\n</head>\n<body>\n"
      << "<header><h1>" << svg::escape(document.title) << "</h1><p>" << inline_html(document.subtitle) << "</p>\n"
      << "<nav><ol>";
  for (const Section& section : document.sections)
    out << "<li><a href=\"#" << section.id << "\">" << svg::escape(section.title) << "</a></li>";
  out << "</ol></nav></header>\n<main>\n";
  for (const Section& section : document.sections) {
    out << "<section id=\"" << section.id << "\">\n<h2>" << svg::escape(section.title) << "</h2>\n";
    html_blocks(section.blocks, out);
    out << "</section>\n";
  }
  out << "</main>\n</body>\n</html>\n";
}

void write_markdown(const Document& document, std::ostream& out) {
  out << "# " << document.title << "\n\n" << document.subtitle << "\n\n";
  int number = 0;
  for (const Section& section : document.sections) {
    out << "## " << ++number << ". " << section.title << "\n\n";
    markdown_blocks(section.blocks, out, 3);
  }
}

namespace {
Block block_of(Block::Kind kind, std::string text = {}) {
  Block block;
  block.kind = kind;
  block.text = std::move(text);
  return block;
}
}  // namespace

Block paragraph(std::string text) { return block_of(Block::Kind::paragraph, std::move(text)); }
Block subheading(std::string text) { return block_of(Block::Kind::subheading, std::move(text)); }
Block callout(std::string text) { return block_of(Block::Kind::callout, std::move(text)); }
Block table(Table table) {
  Block block = block_of(Block::Kind::table);
  block.table = std::move(table);
  return block;
}
Block figure(std::string caption, std::string svg, Table text_equivalent) {
  Block block = block_of(Block::Kind::figure, std::move(caption));
  block.svg = std::move(svg);
  block.table = std::move(text_equivalent);
  return block;
}
Block code(std::string text, std::string id) {
  Block block = block_of(Block::Kind::code, std::move(text));
  block.id = std::move(id);
  return block;
}
Block list(std::vector<std::string> items) {
  Block block = block_of(Block::Kind::list);
  block.items = std::move(items);
  return block;
}
Block collapsible(std::string summary, std::vector<Block> children, bool open) {
  Block block = block_of(Block::Kind::collapsible, std::move(summary));
  block.children = std::move(children);
  block.open = open;
  return block;
}

}  // namespace plumb::present::report
