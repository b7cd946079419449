// Pictures rasterised for the chart tests: SVG by rsvg-convert, PDF by pdftoppm, both at
// 108 dpi (kPngPixelsPerPoint pixels a point), and the pixels of a PNG read back.
#pragma once

#include <catch2/catch.hpp>

#include <cairo.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <unistd.h>
#include <filesystem>
#include <fstream>
#include <string>

#include "shaftwork/charts/axes.hpp"
#include "shaftwork/charts/document.hpp"
#include "shaftwork/charts/palette.hpp"

namespace shaftwork::test {

namespace fs = std::filesystem;
using charts::Colour;

inline fs::path scratch() {
  const fs::path dir = fs::temp_directory_path() / ("shaftwork-charts-" + std::to_string(::getpid()));
  fs::create_directories(dir);
  return dir;
}

class FileSink final : public io::ByteSink {
 public:
  explicit FileSink(const fs::path& p) : out_(p, std::ios::binary) {}
  void write(std::string_view b) override { out_.write(b.data(), static_cast<std::streamsize>(b.size())); }

 private:
  std::ofstream out_;
};

// The PNG the picture at `path` becomes.
inline fs::path rasterise(const fs::path& path) {
  const fs::path png = path.string() + ".raster.png";
  std::string command;
  if (path.extension() == ".png") return path;
  if (path.extension() == ".svg") command = "rsvg-convert -d 108 -p 108 -o '" + png.string() + "' '" + path.string() + "'";
  if (path.extension() == ".pdf") {
    command = "pdftoppm -r 108 -png -singlefile '" + path.string() + "' '" + path.string() + ".raster'";
  }
  REQUIRE(std::system(command.c_str()) == 0);
  return png;
}

struct Raster {
  cairo_surface_t* surface;
  explicit Raster(const fs::path& p) : surface(cairo_image_surface_create_from_png(p.c_str())) {}
  ~Raster() { cairo_surface_destroy(surface); }
  int width() const { return cairo_image_surface_get_width(surface); }
  int height() const { return cairo_image_surface_get_height(surface); }
  Colour at(double x, double y) const {
    const unsigned char* row = cairo_image_surface_get_data(surface) +
                               static_cast<long>(std::lround(y - 0.5)) * cairo_image_surface_get_stride(surface);
    std::uint32_t v = 0;
    std::memcpy(&v, row + 4 * std::lround(x - 0.5), 4);
    return {static_cast<std::uint8_t>(v >> 16), static_cast<std::uint8_t>(v >> 8), static_cast<std::uint8_t>(v)};
  }
};

inline bool near(Colour a, Colour b) {
  return std::abs(a.r - b.r) <= 12 && std::abs(a.g - b.g) <= 12 && std::abs(a.b - b.b) <= 12;
}

// The mark of `colour` lies at the pixel the axis mapping gives for `data`.
inline void check_mark(const Raster& r, const charts::Axes& axes, charts::Point data, Colour colour) {
  const charts::Point page = axes.page(data);
  const double x = page.x * charts::kPngPixelsPerPoint, y = page.y * charts::kPngPixelsPerPoint;
  INFO("mark expected at pixel " << x << ", " << y);
  const Colour seen = r.at(x, y);
  INFO("seen " << int(seen.r) << "," << int(seen.g) << "," << int(seen.b));
  CHECK(near(seen, colour));
  // A mark is about 15 pixels across: 14 pixels off it the colour is gone.
  CHECK_FALSE(near(r.at(x + 14, y + 14), colour));
}

inline std::string run(const std::string& command) {
  std::string out;
  FILE* p = ::popen(command.c_str(), "r");
  REQUIRE(p != nullptr);
  char buffer[4096];
  for (std::size_t n; (n = std::fread(buffer, 1, sizeof buffer, p)) > 0;) out.append(buffer, n);
  ::pclose(p);
  return out;
}

}  // namespace shaftwork::test
