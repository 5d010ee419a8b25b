// How numbers, dates and names appear in every ferrum PDF, so that units and
// precision stay consistent between the unit, fleet and alert documents.
#pragma once

#include <optional>
#include <string>

#include "analytics/assessment.h"

namespace ferrum::report {

// Printed where a value is absent.
inline constexpr const char* kNoValue = "—";

// Fixed decimals, then " unit" when a unit is given; kNoValue when absent.
std::string fmt_number(std::optional<double> v, int decimals, const std::string& unit = "");
// Health index as printed everywhere: whole number ("62"), kNoValue when absent.
std::string fmt_health_index(std::optional<double> hi);
// "12.5 years (9.0–16.0)"; kNoValue when absent.
std::string fmt_years_range(std::optional<double> years, std::optional<double> low,
                            std::optional<double> high);
// A laboratory value with the precision its unit is reported in
// (mg/kg, kV, mN/m whole; mg KOH/g and % two decimals; others one).
std::string fmt_measure(std::optional<double> v, const std::string& unit);
// Gas ppm as laboratories print them: two decimals below 1, one below 10,
// whole numbers from 10 up ("0.25", "4.5", "12", "1308"), never rounded to
// fewer digits, so that the tables agree with texts quoting the same value.
std::string fmt_ppm(std::optional<double> v);
// A rating or sum of ratings in MVA as written on the nameplate: up to three
// decimals, trailing zeros dropped ("7.5", "40", "0.315"); kNoValue when
// absent or not positive. Never rounded to a whole number (7.5 is not 8).
std::string fmt_mva(std::optional<double> v, const std::string& unit = "");
// The equivalent ageing factor, three significant figures on every page
// ("0.00123", "0.850", "1.25"): analytics::significant_figures.
std::string fmt_ageing_factor(std::optional<double> v);
std::string fmt_day(std::optional<analytics::Day> d);
// "2025-06-01 14:00 UTC".
std::string fmt_timestamp(analytics::Timestamp t);

// Readable names for document keys.
std::string factor_title(const std::string& key);     // "dga" -> "Dissolved gases"
std::string oil_test_title(const std::string& key);   // "ift" -> "Interfacial tension"
std::string gas_label(const std::string& gas);        // "C2H2" -> "C₂H₂"
std::string rating_title(analytics::Rating r);        // very_poor -> "very poor"
std::string item_title(const std::string& item);       // "cooling_fans_and_pumps" -> "cooling fans and pumps"
std::string priority_title(int priority);             // 1 -> "P1 urgent"
// A reason for a list's narrow "Why" column: its first sentence (up to "; "
// or ". "), cut at a word to at most `max_chars` with "…" when longer.
std::string short_reason(const std::string& reason, std::size_t max_chars = 90);

}  // namespace ferrum::report
