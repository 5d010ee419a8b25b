# Writes OUT, a C++ file holding every DIR/*.csv as a raw string:
# ferrum::analytics::embedded_data_file(name).
file(GLOB files ${DIR}/*.csv)
list(SORT files)
set(body "")
foreach(f ${files})
  get_filename_component(name ${f} NAME)
  file(READ ${f} text)
  string(APPEND body "      {\"${name}\", R\"ferrumdata(${text})ferrumdata\"},\n")
endforeach()
file(WRITE ${OUT}.tmp "// Generated from analytics/data by analytics/data/embed_data.cmake. Do not edit.\n#include \"analytics/embedded_tables.h\"\n\n#include <utility>\n\nnamespace ferrum::analytics {\n\nstd::string_view embedded_data_file(std::string_view file_name) {\n  static constexpr std::pair<std::string_view, std::string_view> files[] = {\n${body}  };\n  for (const auto& [name, text] : files)\n    if (name == file_name) return text;\n  return {};\n}\n\n}  // namespace ferrum::analytics\n")
file(COPY_FILE ${OUT}.tmp ${OUT} ONLY_IF_DIFFERENT)
