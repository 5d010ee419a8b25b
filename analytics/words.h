// Plain words for the identifiers of the data model, for every text meant for
// people (notes, reasons, reports, console lines): "control_cabinet" ->
// "control cabinet", "oil_quality" -> "oil quality", "dga" -> "dissolved gases".
#pragma once

#include <string>

namespace ferrum::analytics {

std::string words(const std::string& identifier);

// A number to `digits` significant figures, without an exponent and with
// trailing zeros kept to that precision: 0.00123, 0.0500, 1.25, 12.5, 125,
// 1250 (whole numbers from 10^digits up). Used where one quantity (the
// equivalent ageing factor) must print the same on every page.
std::string significant_figures(double v, int digits = 3);

}  // namespace ferrum::analytics
