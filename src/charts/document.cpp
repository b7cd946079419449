#include "shaftwork/charts/document.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>

#include <cairo-pdf.h>
#include <cairo-svg.h>
#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {

ImageFormat image_format_of(const std::string& path) {
  const std::size_t dot = path.find_last_of('.');
  const std::size_t slash = path.find_last_of('/');
  std::string ext = dot == std::string::npos || (slash != std::string::npos && dot < slash) ? "" : path.substr(dot);
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (ext == ".svg") return ImageFormat::svg;
  if (ext == ".png") return ImageFormat::png;
  if (ext == ".pdf") return ImageFormat::pdf;
  throw Error(ErrorKind::bad_input,
              fmt::format("{}: a picture is written as .svg, .png or .pdf; this name ends in \"{}\"", path,
                          ext.empty() ? path.substr(slash == std::string::npos ? 0 : slash + 1) : ext));
}

const char* extension_of(ImageFormat format) {
  switch (format) {
    case ImageFormat::svg: return ".svg";
    case ImageFormat::png: return ".png";
    case ImageFormat::pdf: break;
  }
  return ".pdf";
}

void load_cairo() { cairo_api(); }

cairo_status_t Document::write_bytes(void* closure, const unsigned char* data, unsigned int length) {
  auto* self = static_cast<Document*>(closure);
  if (self->sink_error_) return CAIRO_STATUS_WRITE_ERROR;
  try {
    self->sink_.write(std::string_view(reinterpret_cast<const char*>(data), length));
  } catch (...) {
    self->sink_error_ = std::current_exception();
    return CAIRO_STATUS_WRITE_ERROR;
  }
  return CAIRO_STATUS_SUCCESS;
}

Document::Document(ImageFormat format, io::ByteSink& sink, double width, double height)
    : format_(format), sink_(sink), width_(width), height_(height) {
  switch (format) {
    case ImageFormat::svg:
      surface_ = cairo_api().svg_surface_create_for_stream(&Document::write_bytes, this, width, height);
      cairo_api().svg_surface_set_document_unit(surface_, CAIRO_SVG_UNIT_PT);
      break;
    case ImageFormat::pdf:
      surface_ = cairo_api().pdf_surface_create_for_stream(&Document::write_bytes, this, width, height);
      cairo_api().pdf_surface_set_metadata(surface_, CAIRO_PDF_METADATA_CREATOR, "shaftwork");
      break;
    case ImageFormat::png:
      surface_ = cairo_api().image_surface_create(CAIRO_FORMAT_RGB24,
                                                  static_cast<int>(std::lround(width * kPngPixelsPerPoint)),
                                                  static_cast<int>(std::lround(height * kPngPixelsPerPoint)));
      break;
  }
  cr_ = cairo_api().create(surface_);
  check("cannot start a picture");
}

Document::~Document() {
  cairo_api().destroy(cr_);
  cairo_api().surface_destroy(surface_);
}

void Document::check(const char* step) {
  if (sink_error_) std::rethrow_exception(sink_error_);
  cairo_status_t status = cairo_api().surface_status(surface_);
  if (status == CAIRO_STATUS_SUCCESS) status = cairo_api().status(cr_);
  if (status != CAIRO_STATUS_SUCCESS) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: {}", step, cairo_api().status_to_string(status)));
  }
}

cairo_t* Document::begin_page() {
  if (pages_ > 0 && format_ != ImageFormat::pdf) {
    throw Error(ErrorKind::bad_input, "an SVG or PNG picture holds one page; write several pages as .pdf");
  }
  ++pages_;
  cairo_api().save(cr_);
  if (format_ == ImageFormat::png) cairo_api().scale(cr_, kPngPixelsPerPoint, kPngPixelsPerPoint);
  cairo_api().set_source_rgb(cr_, 1, 1, 1);
  cairo_api().rectangle(cr_, 0, 0, width_, height_);
  cairo_api().fill(cr_);
  return cr_;
}

void Document::end_page() {
  cairo_api().restore(cr_);
  if (format_ == ImageFormat::png) {
    cairo_api().surface_flush(surface_);
    const cairo_status_t status = cairo_api().surface_write_to_png_stream(surface_, &Document::write_bytes, this);
    if (sink_error_) std::rethrow_exception(sink_error_);
    if (status != CAIRO_STATUS_SUCCESS) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("cannot write the PNG: {}", cairo_api().status_to_string(status)));
    }
  } else {
    cairo_api().show_page(cr_);
  }
  check("cannot draw the page");
}

void Document::finish() {
  if (finished_) return;
  finished_ = true;
  cairo_api().surface_finish(surface_);
  check("cannot write the picture");
}

}  // namespace shaftwork::charts
