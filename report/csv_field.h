// CSV fields of the ferrum exports (RFC 4180 quoting).
#pragma once

#include <string>

namespace ferrum::report {

// The field as is, or in double quotes with quotes doubled when it holds a
// comma, a quote or a line end. (Defined in ranking_csv.cpp.)
std::string quote(const std::string& field);

}  // namespace ferrum::report
