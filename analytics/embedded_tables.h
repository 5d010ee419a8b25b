// Data files of analytics/data/ compiled into the library (generated at build
// time by analytics/data/embed_data.cmake), so that a deployed ferrum runs
// without them. The daemon may read a corrected copy from disk instead.
#pragma once

#include <string_view>

namespace ferrum::analytics {

// Text of analytics/data/<file_name> as built; empty when there is no such file.
std::string_view embedded_data_file(std::string_view file_name);

}  // namespace ferrum::analytics
