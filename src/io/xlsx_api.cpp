#include "xlsx_api.hpp"

#include "shaftwork/io/shared_library.hpp"

namespace shaftwork::io {
namespace {

XlsxApi load_xlsx_api() {
  const SharedLibrary lib("libxlsxwriter.so.4", "libxlsxwriter4", "workbooks (--format xlsx)");
  XlsxApi api{};
  // The member's name spelled once: the string taken is the library's name for it.
#define SHAFTWORK_TAKE(prefix, member) lib.take(api.member, prefix #member)
  SHAFTWORK_TAKE("", workbook_new_opt);
  SHAFTWORK_TAKE("", workbook_add_worksheet);
  SHAFTWORK_TAKE("", workbook_add_format);
  SHAFTWORK_TAKE("", workbook_close);
  SHAFTWORK_TAKE("lxw_", workbook_free);
  SHAFTWORK_TAKE("", format_set_bold);
  SHAFTWORK_TAKE("", worksheet_write_string);
  SHAFTWORK_TAKE("", worksheet_write_number);
  SHAFTWORK_TAKE("", worksheet_freeze_panes);
  SHAFTWORK_TAKE("lxw_", strerror);
#undef SHAFTWORK_TAKE
  return api;
}

}  // namespace

const XlsxApi& xlsx_api() {
  static const XlsxApi api = load_xlsx_api();
  return api;
}

}  // namespace shaftwork::io
