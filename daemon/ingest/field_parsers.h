// Parsers for single cells of a drop file. Pure functions of the cell text;
// they allocate nothing on success, so the load-series hot path can call
// them for millions of cells.
//
// Every parser trims surrounding spaces and tabs first. On failure the
// result carries a static plain-language reason a contractor understands;
// the row parser adds the column and the value.
//
// Formats (schema/drop-files.md, "Values"):
//  * numbers: optional sign, digits, optional fraction and exponent (parsed
//    with std::from_chars). In a decimal-comma file (semicolon-delimited)
//    one ',' is the decimal separator; a '.' is also accepted there.
//    Thousands separators, "inf" and "nan" are rejected.
//  * dates: ISO 8601 calendar dates YYYY-MM-DD, always; and, for a party
//    whose date_format says so, DD/MM/YYYY, MM/DD/YYYY or DD.MM.YYYY (day
//    and month of one or two digits, a four-digit year), optionally followed
//    by a time of day, which a date column ignores.
//  * timestamps: YYYY-MM-DD, 'T' or one space, hh:mm, optional :ss and
//    fraction of a second (dropped), then optional 'Z' or an offset ±hh:mm,
//    ±hhmm or ±hh. Without an offset the site's UTC offset is applied and
//    the result says it was assumed. With a party's date_format: its date,
//    one space, h:mm or hh:mm, optional :ss, then the same optional offset.
//  * lab values: empty = not measured; `<number` = below that detection
//    limit; `ND` or `<ND` (any case) = below an unstated limit.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

#include "analytics/calendar.h"
#include "analytics/lab_value.h"

namespace ferrum::ingest {

// A parsed value, or a reason why the text is not one.
template <class T>
struct Parsed {
  T value{};
  const char* error = nullptr;  // static text; nullptr on success
  bool ok() const { return error == nullptr; }
};

// A number as shown in messages: up to 6 significant digits, no trailing zeros.
std::string format_number(double v);

// Removes spaces and tabs at both ends.
std::string_view trim(std::string_view text);

// Case-insensitive ASCII comparison.
bool iequals(std::string_view a, std::string_view b);

Parsed<double> parse_number(std::string_view text, bool decimal_comma);

// Whole numbers only ("3", not "3.0").
Parsed<std::int64_t> parse_integer(std::string_view text);

// The order of day, month and year a party writes dates in
// ([party.NAME] date_format). ISO 8601 is accepted whatever the order.
enum class DateOrder {
  iso,        // YYYY-MM-DD (default)
  dmy_slash,  // DD/MM/YYYY
  mdy_slash,  // MM/DD/YYYY
  dmy_dot,    // DD.MM.YYYY
};

// A date_format value ("DD/MM/YYYY", "DD/MM/YYYY HH:MM", "YYYY-MM-DD
// HH:MM:SS", ...; case-insensitive); false when it is none of them.
// `with_time` says whether the value named a time part.
bool parse_date_format(std::string_view text, DateOrder& order, bool& with_time);
// "YYYY-MM-DD", "DD/MM/YYYY", "MM/DD/YYYY", "DD.MM.YYYY".
const char* date_format_name(DateOrder order);

Parsed<analytics::Day> parse_date(std::string_view text, DateOrder order = DateOrder::iso);

// The decimal separator a party writes ([party.NAME] decimal): `automatic`
// follows the file (a comma in semicolon-separated files, else a point).
enum class DecimalMark { automatic, point, comma };
// "point", "comma" or "auto"; false for anything else.
bool parse_decimal_mark(std::string_view text, DecimalMark& mark);
// Whether numbers are read with a decimal comma, given the file's own convention.
inline bool uses_decimal_comma(DecimalMark mark, bool file_convention) {
  return mark == DecimalMark::automatic ? file_convention : mark == DecimalMark::comma;
}

struct TimeValue {
  analytics::Timestamp utc = 0;   // UTC seconds
  bool offset_assumed = false;    // no 'Z' or offset in the text: the site offset was used
};

// `site_utc_offset_min`: minutes east of UTC used when the text has no offset
// (e.g. +60 for UTC+01:00).
Parsed<TimeValue> parse_timestamp(std::string_view text, int site_utc_offset_min,
                                  DateOrder order = DateOrder::iso);

// Empty text gives LabValue::missing (not measured), never an error.
Parsed<analytics::LabValue> parse_lab_value(std::string_view text, bool decimal_comma);

// Lower case; spaces, hyphens and runs of them become one underscore;
// surrounding underscores dropped: "On-Load Tap  Changer" -> "on_load_tap_changer".
std::string to_snake_case(std::string_view text);

// Cooling class, IEC 60076-2 four-letter codes ([OKL][NFD][AW][NF], e.g. ONAN,
// ONAF, OFAF, ODAF, OFWF, ODWF, KNAN). A combined rating such as
// "ONAN/ONAF" or "ONAN/ONAF/OFAF" gives the highest stage (most forced
// cooling). Result upper case.
Parsed<std::string> parse_cooling(std::string_view text);

// Vector group per IEC 60076-1 clause 6: HV letters D, Y, YN, Z, ZN (or I for
// single phase), then one or more LV windings d, y, yn, z, zn, a (auto) or
// i, each with a clock number 0..11: "Dyn11", "YNd1", "YNyn0d1", "Ii0".
// Any case is accepted; the result is normalised (HV upper, LV lower).
Parsed<std::string> parse_vector_group(std::string_view text);

// Dielectric breakdown test method, normalised to one of
// "ASTM D1816 1 mm", "ASTM D1816 2 mm", "ASTM D877", "IEC 60156".
// Accepts variants such as "D1816-2mm", "astm d1816 (1 mm)", "IEC60156".
Parsed<std::string> parse_breakdown_method(std::string_view text);

}  // namespace ferrum::ingest
