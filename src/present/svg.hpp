// Internal to present: inline SVG pictures drawn by our own code, from plain input structs.
// Geometry uses double (it only places marks on a page); every number printed comes from the
// caller as text, exact where the caller has it.
#pragma once

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace plumb::present::svg {

// Text made safe inside XML/HTML: & < > " escaped.
std::string escape(std::string_view text);

// An SVG drawing of fixed logical size that scales to the width of its container.
class Canvas {
 public:
  // `title` is the picture's accessible name; the text equivalent stands beside the picture.
  Canvas(double width, double height, std::string_view title);
  void rect(double x, double y, double width, double height, std::string_view fill, std::string_view stroke = "none");
  void line(double x1, double y1, double x2, double y2, std::string_view stroke, double width = 1,
            bool dashed = false);
  enum class Anchor { start, middle, end };
  void text(double x, double y, std::string_view text, Anchor anchor = Anchor::start, bool bold = false,
            double size = 12);
  std::string finish() const;

 private:
  double width_;
  double height_;
  std::string body_;
};

// Texts longer than `limit` characters end in an ellipsis, so labels keep their column.
std::string clip(std::string_view text, std::size_t limit);

// One limit and how much of it a plan uses: share in [0, 1] draws the bar; the texts label it.
struct UsageBar {
  std::string label;  // the requirement's name
  double share = 0;   // used / limit, clipped to [0, 1] for drawing
  std::string note;   // e.g. "slack 0 bbl (at its limit)"
  bool at_limit = false;
};
std::string usage_chart(const std::vector<UsageBar>& bars, std::string_view title);

// Amounts on a log scale with a tolerance marked: one bar per item, values > 0.
struct LogBar {
  std::string label;
  double value = 0;
  std::string value_text;  // as printed beside the bar
};
std::string log_bar_chart(const std::vector<LogBar>& bars, double tolerance, std::string_view tolerance_text,
                          std::string_view title);

// Two columns of nodes (e.g. requirements and the quantities they share) joined by labelled edges.
struct GraphNode {
  std::string label;
  std::string note;  // a second, smaller line, e.g. a multiplier or a bound
};
struct GraphEdge {
  std::size_t left = 0;   // index into the left nodes
  std::size_t right = 0;  // index into the right nodes
  std::string label;      // e.g. a coefficient
};
std::string bipartite_graph(const std::vector<GraphNode>& left, const std::vector<GraphNode>& right,
                            const std::vector<GraphEdge>& edges, std::string_view title);

}  // namespace plumb::present::svg
