// Inline SVG pictures for reports: a canvas and three charts built on it.
#include "svg.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace plumb::present::svg {
namespace {

// Ink of the pictures: near-black text and rules, one dark fill, one warning fill, a light track.
constexpr std::string_view ink = "#111111";
constexpr std::string_view fill_dark = "#1d3f6e";
constexpr std::string_view fill_limit = "#9c2a00";
constexpr std::string_view track = "#e4e4e4";
constexpr double font_width = 0.6;  // average glyph width per unit of font size, for layout

std::string number(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.1f", value);
  return buffer;
}

}  // namespace

std::string escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string clip(std::string_view text, std::size_t limit) {
  if (text.size() <= limit) return std::string(text);
  std::size_t cut = limit > 1 ? limit - 1 : 0;
  while (cut > 0 && (static_cast<unsigned char>(text[cut]) & 0xC0) == 0x80) --cut;  // not inside a UTF-8 character
  return std::string(text.substr(0, cut)) + "\u2026";
}

Canvas::Canvas(double width, double height, std::string_view title) : width_(width), height_(height) {
  body_ = "<title>" + escape(title) + "</title>";
}

void Canvas::rect(double x, double y, double width, double height, std::string_view fill, std::string_view stroke) {
  body_ += "<rect x=\"" + number(x) + "\" y=\"" + number(y) + "\" width=\"" + number(width) + "\" height=\"" +
           number(height) + "\" fill=\"" + std::string(fill) + "\"";
  if (stroke != "none") body_ += " stroke=\"" + std::string(stroke) + "\"";
  body_ += "/>";
}

void Canvas::line(double x1, double y1, double x2, double y2, std::string_view stroke, double width, bool dashed) {
  body_ += "<line x1=\"" + number(x1) + "\" y1=\"" + number(y1) + "\" x2=\"" + number(x2) + "\" y2=\"" + number(y2) +
           "\" stroke=\"" + std::string(stroke) + "\" stroke-width=\"" + number(width) + "\"";
  if (dashed) body_ += " stroke-dasharray=\"5 3\"";
  body_ += "/>";
}

void Canvas::text(double x, double y, std::string_view text, Anchor anchor, bool bold, double size) {
  static constexpr const char* anchors[] = {"start", "middle", "end"};
  body_ += "<text x=\"" + number(x) + "\" y=\"" + number(y) + "\" font-size=\"" + number(size) +
           "\" text-anchor=\"" + anchors[static_cast<int>(anchor)] + "\"";
  if (bold) body_ += " font-weight=\"bold\"";
  body_ += ">" + escape(text) + "</text>";
}

std::string Canvas::finish() const {
  return "<svg xmlns=\"http://www.w3.org/2000/svg\" role=\"img\" viewBox=\"0 0 " + number(width_) + " " +
         number(height_) + "\" width=\"100%\" font-family=\"sans-serif\" fill=\"" + std::string(ink) + "\">" +
         body_ + "</svg>";
}

// Label column, bar, note: the bar's full length is the whole limit.
std::string usage_chart(const std::vector<UsageBar>& bars, std::string_view title) {
  constexpr double width = 640, label_width = 150, bar_width = 260, row = 26, top = 22;
  Canvas canvas(width, top + row * static_cast<double>(bars.size()) + 8, title);
  canvas.text(label_width, 14, "0", Canvas::Anchor::middle, false, 10);
  canvas.text(label_width + bar_width, 14, "the limit", Canvas::Anchor::middle, false, 10);
  for (std::size_t k = 0; k < bars.size(); ++k) {
    const UsageBar& bar = bars[k];
    double y = top + row * static_cast<double>(k);
    canvas.text(label_width - 8, y + 14, clip(bar.label, 22), Canvas::Anchor::end);
    canvas.rect(label_width, y + 3, bar_width, 16, track, ink);
    double share = std::clamp(bar.share, 0.0, 1.0);
    canvas.rect(label_width, y + 3, bar_width * share, 16, bar.at_limit ? fill_limit : fill_dark);
    canvas.text(label_width + bar_width + 8, y + 15, clip(bar.note, 38), Canvas::Anchor::start, bar.at_limit, 11);
  }
  canvas.line(label_width + bar_width, top - 2, label_width + bar_width, top + row * static_cast<double>(bars.size()),
              ink, 1.5);
  return canvas.finish();
}

// Decades from below the smallest value (or the tolerance) to above the largest.
std::string log_bar_chart(const std::vector<LogBar>& bars, double tolerance, std::string_view tolerance_text,
                          std::string_view title) {
  constexpr double width = 640, label_width = 150, bar_width = 330, row = 26, top = 30;
  double low = tolerance > 0 ? tolerance : 1, high = low;
  for (const LogBar& bar : bars)
    if (bar.value > 0) low = std::min(low, bar.value), high = std::max(high, bar.value);
  double first = std::floor(std::log10(low)), last = std::ceil(std::log10(high));
  if (last <= first) last = first + 1;
  auto position = [&](double value) {
    return label_width + bar_width * (std::log10(value) - first) / (last - first);
  };
  double bottom = top + row * static_cast<double>(bars.size());
  Canvas canvas(width, bottom + 24, title);
  for (double decade = first; decade <= last; ++decade) {
    double x = label_width + bar_width * (decade - first) / (last - first);
    canvas.line(x, top - 4, x, bottom, track);
    canvas.text(x, bottom + 14, "1e" + std::to_string(static_cast<int>(decade)), Canvas::Anchor::middle, false, 10);
  }
  for (std::size_t k = 0; k < bars.size(); ++k) {
    const LogBar& bar = bars[k];
    double y = top + row * static_cast<double>(k);
    canvas.text(label_width - 8, y + 14, clip(bar.label, 22), Canvas::Anchor::end);
    if (bar.value > 0) canvas.rect(label_width, y + 3, position(bar.value) - label_width, 16, fill_limit);
    canvas.text(label_width + bar_width + 8, y + 15, clip(bar.value_text, 24), Canvas::Anchor::start, false, 11);
  }
  if (tolerance > 0) {
    double x = position(tolerance);
    canvas.line(x, top - 8, x, bottom, ink, 2, true);
    canvas.text(x, top - 12, "tolerance " + std::string(tolerance_text), Canvas::Anchor::middle, true, 10);
  }
  return canvas.finish();
}

// Left nodes in one column, right nodes in another, evenly spaced; edge labels sit at a third of
// the way from the right, where fewer edges cross.
std::string bipartite_graph(const std::vector<GraphNode>& left, const std::vector<GraphNode>& right,
                            const std::vector<GraphEdge>& edges, std::string_view title) {
  constexpr double width = 640, box_width = 180, box_height = 34, gap = 14, top = 10;
  std::size_t rows = std::max(left.size(), right.size());
  double height = top * 2 + static_cast<double>(rows) * (box_height + gap);
  auto y_of = [&](std::size_t k, std::size_t count) {
    double span = height - 2 * top - box_height;
    return top + (count <= 1 ? span / 2 : span * static_cast<double>(k) / static_cast<double>(count - 1));
  };
  Canvas canvas(width, height, title);
  double left_x = 10, right_x = width - box_width - 10;
  for (const GraphEdge& edge : edges) {
    if (edge.left >= left.size() || edge.right >= right.size()) continue;
    double y1 = y_of(edge.left, left.size()) + box_height / 2, y2 = y_of(edge.right, right.size()) + box_height / 2;
    double x1 = left_x + box_width, x2 = right_x;
    canvas.line(x1, y1, x2, y2, fill_dark, 1.2);
    double t = 0.62;
    double lx = x1 + (x2 - x1) * t, ly = y1 + (y2 - y1) * t;
    double label_width = static_cast<double>(edge.label.size()) * 10 * font_width + 6;
    canvas.rect(lx - label_width / 2, ly - 8, label_width, 14, "#ffffff");
    canvas.text(lx, ly + 3, edge.label, Canvas::Anchor::middle, false, 10);
  }
  auto draw = [&](const std::vector<GraphNode>& nodes, double x) {
    for (std::size_t k = 0; k < nodes.size(); ++k) {
      double y = y_of(k, nodes.size());
      canvas.rect(x, y, box_width, box_height, "#ffffff", ink);
      canvas.text(x + 6, y + 14, clip(nodes[k].label, 27), Canvas::Anchor::start, true, 11);
      canvas.text(x + 6, y + 28, clip(nodes[k].note, 32), Canvas::Anchor::start, false, 10);
    }
  };
  draw(left, left_x);
  draw(right, right_x);
  return canvas.finish();
}

}  // namespace plumb::present::svg
