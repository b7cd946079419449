#include "cairo_api.hpp"

#include "shaftwork/io/shared_library.hpp"

namespace shaftwork::charts {
namespace {

CairoApi load_cairo_api() {
  const io::SharedLibrary lib("libcairo.so.2", "libcairo2", "pictures (--plot, --report)");
  CairoApi api{};
  // The member's name spelled once: the string taken is Cairo's name for it.
#define SHAFTWORK_TAKE(member) lib.take(api.member, "cairo_" #member)
  SHAFTWORK_TAKE(arc);
  SHAFTWORK_TAKE(clip);
  SHAFTWORK_TAKE(close_path);
  SHAFTWORK_TAKE(create);
  SHAFTWORK_TAKE(destroy);
  SHAFTWORK_TAKE(fill);
  SHAFTWORK_TAKE(fill_preserve);
  SHAFTWORK_TAKE(image_surface_create);
  SHAFTWORK_TAKE(line_to);
  SHAFTWORK_TAKE(move_to);
  SHAFTWORK_TAKE(new_path);
  SHAFTWORK_TAKE(pdf_surface_create_for_stream);
  SHAFTWORK_TAKE(pdf_surface_set_metadata);
  SHAFTWORK_TAKE(rectangle);
  SHAFTWORK_TAKE(restore);
  SHAFTWORK_TAKE(rotate);
  SHAFTWORK_TAKE(save);
  SHAFTWORK_TAKE(scale);
  SHAFTWORK_TAKE(select_font_face);
  SHAFTWORK_TAKE(set_dash);
  SHAFTWORK_TAKE(set_font_size);
  SHAFTWORK_TAKE(set_line_cap);
  SHAFTWORK_TAKE(set_line_join);
  SHAFTWORK_TAKE(set_line_width);
  SHAFTWORK_TAKE(set_source_rgb);
  SHAFTWORK_TAKE(set_source_rgba);
  SHAFTWORK_TAKE(show_page);
  SHAFTWORK_TAKE(show_text);
  SHAFTWORK_TAKE(status);
  SHAFTWORK_TAKE(status_to_string);
  SHAFTWORK_TAKE(stroke);
  SHAFTWORK_TAKE(surface_destroy);
  SHAFTWORK_TAKE(surface_finish);
  SHAFTWORK_TAKE(surface_flush);
  SHAFTWORK_TAKE(surface_status);
  SHAFTWORK_TAKE(surface_write_to_png_stream);
  SHAFTWORK_TAKE(svg_surface_create_for_stream);
  SHAFTWORK_TAKE(svg_surface_set_document_unit);
  SHAFTWORK_TAKE(text_extents);
  SHAFTWORK_TAKE(translate);
#undef SHAFTWORK_TAKE
  return api;
}

}  // namespace

const CairoApi& cairo_api() {
  static const CairoApi api = load_cairo_api();
  return api;
}

}  // namespace shaftwork::charts
