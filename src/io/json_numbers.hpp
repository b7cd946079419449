// Numbers into result JSON (result_json.cpp, guarantee_json.cpp). Internal to the io layer.
#pragma once

#include <string_view>

#include <nlohmann/json.hpp>

namespace shaftwork::io {

// Sets j[a][b]... along the dotted key to rounded_for_output(value) (number_format.hpp).
void json_place(nlohmann::ordered_json& j, std::string_view key, double value);

}  // namespace shaftwork::io
