// Number formatting shared by every output: result rows, cell labels, data
// files and the random-stream keys derived from labels. One function, so a
// number is written the same way everywhere.
#pragma once

#include <string>

namespace locind::base {

// The shortest decimal text that reads back to the same double
// (std::to_chars round-trip form), e.g. 0.1 -> "0.1", 1e-20 -> "1e-20".
std::string FormatNumber(double value);

// Appends FormatNumber(value) to `out` without a temporary string (the
// writers of large data files call it once per number).
void AppendNumber(std::string& out, double value);

}  // namespace locind::base
