#include "daemon/config/party_formats.h"

#include <fstream>

namespace ferrum::config {

PartyFormats load_party_formats(const Poco::Util::AbstractConfiguration& ini, const std::filesystem::path& columns_dir,
                                const std::string& name) {
  PartyFormats p;
  const std::string section = "party." + name;
  p.date_format = ini.getString(section + ".date_format", "YYYY-MM-DD");
  bool with_time = false;
  if (!ingest::parse_date_format(p.date_format, p.date_order, with_time))
    throw ConfigError(section + ".date_format: '" + p.date_format +
                      "' must be YYYY-MM-DD, DD/MM/YYYY, MM/DD/YYYY or DD.MM.YYYY, optionally followed by HH:MM "
                      "or HH:MM:SS");
  const std::string decimal = ini.getString(section + ".decimal", "auto");
  if (!ingest::parse_decimal_mark(decimal, p.decimal))
    throw ConfigError(section + ".decimal: '" + decimal + "' must be point, comma or auto");

  const std::filesystem::path map_path = columns_dir / (name + ".csv");
  std::error_code ec;
  if (!std::filesystem::exists(std::filesystem::symlink_status(map_path, ec))) return p;
  const std::string shown = "columns/" + name + ".csv";
  if (!std::filesystem::is_regular_file(map_path, ec))
    throw ConfigError(shown + ": the column map must be a regular file");
  std::ifstream in(map_path, std::ios::binary);
  if (!in) throw ConfigError(shown + ": cannot be read (check its permissions)");
  try {
    p.columns = ingest::HeaderMap::parse(in);
  } catch (const ingest::HeaderMapError& e) {
    throw ConfigError(shown + ":" + std::to_string(e.line()) + ": " + e.what());
  }
  if (in.bad()) throw ConfigError(shown + ": cannot be read");
  return p;
}

bool same_formats(const PartyFormats& a, const PartyFormats& b) {
  return a.columns == b.columns && a.date_order == b.date_order && a.decimal == b.decimal &&
         a.date_format == b.date_format;
}

}  // namespace ferrum::config
