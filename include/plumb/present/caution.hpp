// The caution every report carries: plumb proves the mathematics, not the model's fitness.
#pragma once

namespace plumb::present {

// The line every report (text and JSON) carries, once.
extern const char* const caution_line;

}  // namespace plumb::present
