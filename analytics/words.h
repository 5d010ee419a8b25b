// Plain words for the identifiers of the data model, for every text meant for
// people (notes, reasons, reports, console lines): "control_cabinet" ->
// "control cabinet", "oil_quality" -> "oil quality", "dga" -> "dissolved gases".
#pragma once

#include <string>

namespace ferrum::analytics {

std::string words(const std::string& identifier);

}  // namespace ferrum::analytics
