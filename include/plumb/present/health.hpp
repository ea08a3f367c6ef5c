// Renderings of a model-health report: readable text for people, JSON for programs.
#pragma once

#include "plumb/health/health.hpp"
#include "plumb/present/caution.hpp"

#include <nlohmann/json.hpp>

#include <iosfwd>
#include <string>

namespace plumb::present {

// Sections with short headings and aligned columns; ends with caution_line.
void write_health_text(const health::HealthReport& report, std::ostream& out);

// The keys of docs/inspect.md; exact numbers as canonical fraction strings, infinite sides null.
nlohmann::json health_json(const health::HealthReport& report);
void write_health_json(const health::HealthReport& report, std::ostream& out);

}  // namespace plumb::present
