// libxlsxwriter, opened at the first workbook (io/shared_library.hpp says why it is not
// linked). Internal to the io layer: only the Workbook (result_xlsx.cpp) calls it.
//
// A workbook call goes through the table: xlsx_api().worksheet_write_string(...). A new
// call adds its member here, typed from the library's own declaration, and one line in
// xlsx_api.cpp; a member is named as the library's function, without a leading "lxw_".
#pragma once

#include <xlsxwriter.h>

namespace shaftwork::io {

struct XlsxApi {
  decltype(&::workbook_new_opt) workbook_new_opt;
  decltype(&::workbook_add_worksheet) workbook_add_worksheet;
  decltype(&::workbook_add_format) workbook_add_format;
  decltype(&::workbook_close) workbook_close;
  decltype(&::lxw_workbook_free) workbook_free;
  decltype(&::format_set_bold) format_set_bold;
  decltype(&::worksheet_write_string) worksheet_write_string;
  decltype(&::worksheet_write_number) worksheet_write_number;
  decltype(&::worksheet_freeze_panes) worksheet_freeze_panes;
  decltype(&::lxw_strerror) strerror;
};

// The table, filled at the first call (once, safely across threads). Throws not_available
// naming libxlsxwriter.so.4 and its Debian package, libxlsxwriter4, when the library or one
// of its functions cannot be loaded; a later call tries again.
const XlsxApi& xlsx_api();

}  // namespace shaftwork::io
