// Numbers into result JSON (result_json.cpp, guarantee_json.cpp). Internal to the io layer.
#pragma once

#include <string_view>

#include <nlohmann/json.hpp>

namespace shaftwork::io {

// An SI value rounded to 15 significant digits: the digits a double holds for sure, so
// that unit conversions leave no noise in the last place (4120800, not 4120800.0000000005).
double json_rounded(double x);

// Sets j[a][b]... along the dotted key to json_rounded(value).
void json_place(nlohmann::ordered_json& j, std::string_view key, double value);

}  // namespace shaftwork::io
