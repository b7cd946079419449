// shaftwork/charts/document.hpp — pages drawn through Cairo into SVG, PNG or PDF.
//
// One drawing code serves the three formats: a chart draws on a cairo_t in points
// (1/72 in), and the Document behind it is a Cairo surface of the format the file name
// asks for. Bytes go to an io::ByteSink (io::OutputFile for a file: whole or not at all).
// SVG and PNG hold one page; PDF holds any number. Cairo is opened by the first Document
// (or load_cairo), not when the program starts (src/charts/cairo_api.hpp).
#pragma once

#include <exception>
#include <string>

#include <cairo.h>

#include "shaftwork/io/byte_stream.hpp"

namespace shaftwork::charts {

enum class ImageFormat { svg, png, pdf };

// The format named by the extension of `path` (.svg, .png, .pdf, in any case). Throws
// bad_input "PATH: a picture is written as .svg, .png or .pdf; this name ends in \".x\"".
ImageFormat image_format_of(const std::string& path);
// ".svg", ".png" or ".pdf".
const char* extension_of(ImageFormat format);

// Opens Cairo now, as the first Document would, for a command that checks what it needs
// before its work. Throws not_available naming libcairo.so.2 and its Debian package,
// libcairo2, when it cannot be loaded.
void load_cairo();

// A rectangle on a page, in points from the top left corner.
struct Rect {
  double x = 0, y = 0, width = 0, height = 0;
};

// The page of a chart on its own (--plot): 720 x 480 points, 10 x 6.67 inches.
inline constexpr Rect kChartPage{0, 0, 720, 480};

// A PNG holds this many pixels per point (108 pixels per inch): a 720 x 480 pt chart is
// 1080 x 720 pixels. rsvg-convert and pdftoppm at 108 dpi give the same raster.
inline constexpr double kPngPixelsPerPoint = 1.5;

class Document {
 public:
  // Pages of `width` x `height` points, written to `sink` (which must outlive the document).
  // Throws as load_cairo does when Cairo cannot be loaded.
  Document(ImageFormat format, io::ByteSink& sink, double width, double height);
  Document(const Document&) = delete;
  Document& operator=(const Document&) = delete;
  ~Document();

  // A new white page to draw on, in points. Throws bad_input when a second page is asked
  // of an SVG or PNG.
  cairo_t* begin_page();
  // Ends the page (a PNG is written out here).
  void end_page();
  // Writes out what is left. Throws the sink's error, or bad_input naming Cairo's.
  void finish();

  ImageFormat format() const { return format_; }

 private:
  static cairo_status_t write_bytes(void* closure, const unsigned char* data, unsigned int length);
  void check(const char* step);

  ImageFormat format_;
  io::ByteSink& sink_;
  double width_, height_;
  cairo_surface_t* surface_ = nullptr;
  cairo_t* cr_ = nullptr;
  int pages_ = 0;
  bool finished_ = false;
  std::exception_ptr sink_error_;  // the sink's exception, kept across Cairo's C frames
};

}  // namespace shaftwork::charts
