// libxlsxwriter, opened when the first workbook is written.
//
// Most runs write no workbook, yet a linked libxlsxwriter is loaded at every
// start-up together with what it links (libcrypto, minizip, zlib): mapping and
// relocating those cost about 4 ms of process time per run, more than the
// whole start-up budget of `heatdeck check` (tools/bench.sh, P2).  So heatdeck
// does not link it: XlsxLibrary() opens it with dlopen() on first use and
// looks up the entry points the workbook writer calls.  Each entry point's
// type is taken from the library's own header (decltype), so a call through
// the table is type-checked exactly as a direct call would be.
#pragma once

#include <xlsxwriter.h>

#include <string>

namespace heatdeck::xlsx {

// Every libxlsxwriter function report/xlsx_writer.cpp calls.
// clang-format off
#define HD_XLSX_FUNCTIONS(X) \
  X(chart_add_series) \
  X(chart_axis_set_name) \
  X(chart_legend_set_position) \
  X(chart_series_set_categories) \
  X(chart_series_set_name) \
  X(chart_series_set_values) \
  X(chart_title_set_name) \
  X(format_set_bg_color) \
  X(format_set_bold) \
  X(format_set_border) \
  X(format_set_border_color) \
  X(format_set_bottom) \
  X(format_set_font_color) \
  X(format_set_font_size) \
  X(format_set_italic) \
  X(format_set_text_wrap) \
  X(lxw_strerror) \
  X(workbook_add_chart) \
  X(workbook_add_format) \
  X(workbook_add_worksheet) \
  X(workbook_close) \
  X(workbook_define_name) \
  X(workbook_new) \
  X(workbook_set_properties) \
  X(worksheet_activate) \
  X(worksheet_fit_to_pages) \
  X(worksheet_freeze_panes) \
  X(worksheet_insert_chart) \
  X(worksheet_merge_range) \
  X(worksheet_repeat_rows) \
  X(worksheet_set_column) \
  X(worksheet_set_landscape) \
  X(worksheet_set_row) \
  X(worksheet_write_comment_opt) \
  X(worksheet_write_formula_num) \
  X(worksheet_write_formula_str) \
  X(worksheet_write_number) \
  X(worksheet_write_string)
// clang-format on

struct Library {
#define HD_XLSX_MEMBER(name) decltype(&::name) name = nullptr;
  HD_XLSX_FUNCTIONS(HD_XLSX_MEMBER)
#undef HD_XLSX_MEMBER
};

// The opened library (loaded once, thread-safe, never closed), or nullptr with
// *why set to why it could not be opened.
const Library* XlsxLibrary(std::string* why);

}  // namespace heatdeck::xlsx
