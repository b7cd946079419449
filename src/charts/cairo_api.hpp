// Cairo, opened at the first picture (io/shared_library.hpp says why it is not linked).
// Internal to the charts layer.
//
// A drawing call goes through the table: cairo_api().move_to(cr, x, y). A new call adds its
// member here, typed from Cairo's own declaration, and one line in cairo_api.cpp; a member
// is named as Cairo's function without its "cairo_".
#pragma once

#include <cairo-pdf.h>
#include <cairo-svg.h>
#include <cairo.h>

namespace shaftwork::charts {

struct CairoApi {
  decltype(&::cairo_arc) arc;
  decltype(&::cairo_clip) clip;
  decltype(&::cairo_close_path) close_path;
  decltype(&::cairo_create) create;
  decltype(&::cairo_destroy) destroy;
  decltype(&::cairo_fill) fill;
  decltype(&::cairo_fill_preserve) fill_preserve;
  decltype(&::cairo_image_surface_create) image_surface_create;
  decltype(&::cairo_line_to) line_to;
  decltype(&::cairo_move_to) move_to;
  decltype(&::cairo_new_path) new_path;
  decltype(&::cairo_pdf_surface_create_for_stream) pdf_surface_create_for_stream;
  decltype(&::cairo_pdf_surface_set_metadata) pdf_surface_set_metadata;
  decltype(&::cairo_rectangle) rectangle;
  decltype(&::cairo_restore) restore;
  decltype(&::cairo_rotate) rotate;
  decltype(&::cairo_save) save;
  decltype(&::cairo_scale) scale;
  decltype(&::cairo_select_font_face) select_font_face;
  decltype(&::cairo_set_dash) set_dash;
  decltype(&::cairo_set_font_size) set_font_size;
  decltype(&::cairo_set_line_cap) set_line_cap;
  decltype(&::cairo_set_line_join) set_line_join;
  decltype(&::cairo_set_line_width) set_line_width;
  decltype(&::cairo_set_source_rgb) set_source_rgb;
  decltype(&::cairo_set_source_rgba) set_source_rgba;
  decltype(&::cairo_show_page) show_page;
  decltype(&::cairo_show_text) show_text;
  decltype(&::cairo_status) status;
  decltype(&::cairo_status_to_string) status_to_string;
  decltype(&::cairo_stroke) stroke;
  decltype(&::cairo_surface_destroy) surface_destroy;
  decltype(&::cairo_surface_finish) surface_finish;
  decltype(&::cairo_surface_flush) surface_flush;
  decltype(&::cairo_surface_status) surface_status;
  decltype(&::cairo_surface_write_to_png_stream) surface_write_to_png_stream;
  decltype(&::cairo_svg_surface_create_for_stream) svg_surface_create_for_stream;
  decltype(&::cairo_svg_surface_set_document_unit) svg_surface_set_document_unit;
  decltype(&::cairo_text_extents) text_extents;
  decltype(&::cairo_translate) translate;
};

// The table, filled at the first call (once, safely across threads). Throws not_available
// naming libcairo.so.2 and its Debian package, libcairo2, when the library or one of its
// functions cannot be loaded; a later call tries again. A Document calls it first: drawing
// on the cairo_t it gives finds the table filled.
const CairoApi& cairo_api();

}  // namespace shaftwork::charts
