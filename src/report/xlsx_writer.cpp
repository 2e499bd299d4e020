#include "report/xlsx_writer.h"

#include <algorithm>
#include <cmath>
#include <ctime>
#include <deque>
#include <map>
#include <set>
#include <string_view>

#include <fmt/format.h>

#include "report/report_common.h"
#include "report/xlsx_formula.h"
#include "report/xlsx_library.h"

namespace heatdeck {
namespace {

// Columns of a calculation sheet (docs/workbook.md "Calculation sheets").
enum Col : lxw_col_t {
  kColSymbol = 0,
  kColDescription,
  kColSi,
  kColSiUnit,
  kColDisplay,
  kColUnit,
  kColSource,
  kColNotes,
};
// Check rows reuse the columns: sides in C and E, verdict in F, margin in G.
constexpr lxw_col_t kColLhs = kColSi;
constexpr lxw_col_t kColRhs = kColDisplay;
constexpr lxw_col_t kColVerdict = kColUnit;
constexpr lxw_col_t kColMargin = kColSource;
constexpr lxw_row_t kFirstContentRow = 5;

// A spreadsheet cell holds at most 32767 characters.
constexpr size_t kMaxCellChars = 32767;
// A sheet has 1048576 rows; a sweep table stops well short of that.
constexpr size_t kMaxSweepRows = 1000000;

// The document's creation date when the deck gives none (meta date or
// --date): fixed, so that the bytes never depend on the clock.
constexpr time_t kFixedCreated = 946684800;  // 2000-01-01T00:00:00Z

// Days since 1970-01-01 of a proleptic Gregorian date (the civil-from-days
// inverse; std::chrono's year_month_day would need the C++20 calendar
// library that not every standard library ships complete).
int64_t DaysFromCivil(int64_t y, int64_t m, int64_t d) {
  y -= m <= 2 ? 1 : 0;
  const int64_t era = (y >= 0 ? y : y - 399) / 400;
  const int64_t yoe = y - era * 400;
  const int64_t doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
  const int64_t doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
  return era * 146097 + doe - 719468;
}

// Midnight UTC of a "YYYY-MM-DD" date, or kFixedCreated.
time_t CreatedTime(const std::string& date) {
  if (date.size() != 10 || date[4] != '-' || date[7] != '-') return kFixedCreated;
  for (size_t i : {0, 1, 2, 3, 5, 6, 8, 9}) {
    if (date[i] < '0' || date[i] > '9') return kFixedCreated;
  }
  const int y = std::stoi(date.substr(0, 4));
  const int m = std::stoi(date.substr(5, 2));
  const int d = std::stoi(date.substr(8, 2));
  static constexpr int kDays[] = {31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  if (y < 1970 || m < 1 || m > 12 || d < 1 || d > kDays[m - 1]) return kFixedCreated;
  if (m == 2 && d == 29 && !(y % 4 == 0 && (y % 100 != 0 || y % 400 == 0))) return kFixedCreated;
  return static_cast<time_t>(DaysFromCivil(y, m, d) * 86400);
}

// Cuts text to what a cell holds, at a UTF-8 character boundary, and says
// so at the end: a reviewer must not take a cut description for the whole.
// (The limit counts bytes, which is never fewer than the UTF-16 units a
// spreadsheet counts.)
std::string CellText(std::string s) {
  if (s.size() <= kMaxCellChars) return s;
  static constexpr std::string_view kCut =
      " … [cut: a cell holds 32 767 characters; the HTML report has the whole text]";
  size_t n = kMaxCellChars - kCut.size();
  while (n > 0 && (static_cast<unsigned char>(s[n]) & 0xC0) == 0x80) --n;
  s.resize(n);
  s += kCut;
  return s;
}

std::string SiUnitText(const units::Dimension& d) {
  const std::string u = d.SiUnit();
  return u.empty() ? "1" : u;
}

std::string UnitText(const units::Unit& u) { return u.text.empty() ? "1" : u.text; }

// A1 address of a cell, absolute or relative.
std::string Cell(lxw_row_t row, lxw_col_t col, bool absolute) {
  std::string letters;
  for (uint32_t c = col + 1; c > 0; c = (c - 1) / 26) {
    letters.insert(letters.begin(), static_cast<char>('A' + (c - 1) % 26));
  }
  return absolute ? fmt::format("${}${}", letters, row + 1) : fmt::format("{}{}", letters, row + 1);
}

// A sheet name as a formula or defined name refers to it.
std::string SheetRef(const std::string& sheet) {
  std::string quoted = "'";
  for (char c : sheet) {
    quoted += c;
    if (c == '\'') quoted += '\'';
  }
  return quoted + "'";
}

const char* KindLabel(QuantityMessage::Kind k) {
  switch (k) {
    case QuantityMessage::Kind::kWarning:
      return "warning";
    case QuantityMessage::Kind::kNote:
      return "note";
    case QuantityMessage::Kind::kError:
      return "error";
  }
  return "note";
}

class Writer {
 public:
  Writer(const xlsx::Library& lx, const Results& results, lxw_workbook* wb)
      : lx_(lx),
        r_(results),
        m_(*results.model),
        wb_(wb),
        names_(xlsx::MakeDefinedNames(m_)),
        formulas_(m_, names_.quantities) {}

  // Builds every sheet; returns false with *error on the first failure.
  bool Build(std::string* error);

 private:
  struct CheckRows {
    lxw_row_t first = 0, last = 0;
    bool any = false;
  };

  void MakeStyles();
  // Landscape, one page wide, the header row (if any) repeated on every page.
  void PrintSetup(lxw_worksheet* ws, lxw_row_t header_row, bool repeat = true) {
    lx_.worksheet_set_landscape(ws);
    lx_.worksheet_fit_to_pages(ws, 1, 0);
    if (repeat)
      Check(lx_.worksheet_repeat_rows(ws, header_row, header_row), "setting the print titles");
  }
  void SetProperties();
  void Summary(lxw_worksheet* ws, const std::vector<std::string>& sheets,
               const std::vector<CheckRows>& check_rows);
  CheckRows CaseSheet(size_t case_index, lxw_worksheet* ws, const std::string& sheet);
  void QuantityRow(const CaseResult& c, int qi, lxw_worksheet* ws, lxw_row_t row,
                   const std::string& sheet, bool global);
  void CheckRow(const CaseResult& c, size_t k, lxw_worksheet* ws, lxw_row_t row,
                const std::string& sheet, bool global);
  void SweepSheet(const SweepResult& s, lxw_worksheet* ws, const std::string& sheet);

  // libxlsxwriter keeps pointers to some strings until the workbook is
  // closed; everything passed to it lives here.
  const char* Keep(std::string s) { return kept_.emplace_back(std::move(s)).c_str(); }
  void Check(lxw_error e, const std::string& what) {
    if (e != LXW_NO_ERROR && error_.empty())
      error_ = fmt::format("{}: {}", what, lx_.lxw_strerror(e));
  }
  void Text(lxw_worksheet* ws, lxw_row_t row, lxw_col_t col, const std::string& s,
            lxw_format* f = nullptr) {
    if (s.empty() && f == nullptr) return;
    // write_string stores a shared string: text that starts with '=' stays text.
    Check(lx_.worksheet_write_string(ws, row, col, Keep(CellText(s)), f), "writing text");
  }
  void Number(lxw_worksheet* ws, lxw_row_t row, lxw_col_t col, double v, lxw_format* f) {
    if (std::isfinite(v)) {
      Check(lx_.worksheet_write_number(ws, row, col, v, f), "writing a number");
    } else {
      Check(lx_.worksheet_write_string(ws, row, col, "#N/A", f), "writing a number");
    }
  }
  // A formula with heatdeck's value cached, so that a reader that does not
  // recalculate shows the report's numbers.
  void Formula(lxw_worksheet* ws, lxw_row_t row, lxw_col_t col, const std::string& formula,
               double cached, lxw_format* f) {
    const char* text = Keep("=" + formula);
    if (std::isfinite(cached)) {
      Check(lx_.worksheet_write_formula_num(ws, row, col, text, f, cached), "writing a formula");
    } else {
      Check(lx_.worksheet_write_formula_str(ws, row, col, text, f, "#N/A"), "writing a formula");
    }
  }
  void FormulaText(lxw_worksheet* ws, lxw_row_t row, lxw_col_t col, const std::string& formula,
                   const std::string& cached, lxw_format* f) {
    Check(lx_.worksheet_write_formula_str(ws, row, col, Keep("=" + formula), f, Keep(cached)),
          "writing a formula");
  }
  void Note(lxw_worksheet* ws, lxw_row_t row, lxw_col_t col, const std::string& text) {
    lxw_comment_options o{};
    o.width = 360;
    o.height = 120;
    Check(lx_.worksheet_write_comment_opt(ws, row, col, Keep(CellText(text)), &o),
          "writing a note");
  }
  void DefineName(const std::string& name, const std::string& sheet, lxw_row_t row, lxw_col_t col,
                  bool global) {
    const std::string target = "=" + SheetRef(sheet) + "!" + Cell(row, col, true);
    const std::string full = global ? name : SheetRef(sheet) + "!" + name;
    Check(lx_.workbook_define_name(wb_, Keep(full), Keep(target)), "defining the name " + full);
  }

  const xlsx::Library& lx_;
  const Results& r_;
  const Model& m_;
  lxw_workbook* wb_;
  xlsx::DefinedNames names_;
  xlsx::FormulaWriter formulas_;
  std::deque<std::string> kept_;
  std::string error_;

  lxw_format* title_ = nullptr;
  lxw_format* bold_ = nullptr;
  lxw_format* header_ = nullptr;
  lxw_format* section_ = nullptr;
  lxw_format* narrative_ = nullptr;
  lxw_format* input_ = nullptr;
  lxw_format* value_only_ = nullptr;
  lxw_format* caution_ = nullptr;
};

void Writer::MakeStyles() {
  title_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bold(title_);
  lx_.format_set_font_size(title_, 14);
  bold_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bold(bold_);
  header_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bold(header_);
  lx_.format_set_bottom(header_, LXW_BORDER_THIN);
  lx_.format_set_bg_color(header_, 0xDDDDDD);
  section_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bold(section_);
  lx_.format_set_bg_color(section_, 0xD9E1F2);
  narrative_ = lx_.workbook_add_format(wb_);
  lx_.format_set_italic(narrative_);
  // Inputs: yellow, the common spreadsheet convention for cells a user
  // may change.
  input_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bg_color(input_, 0xFFF2CC);
  lx_.format_set_border(input_, LXW_BORDER_THIN);
  lx_.format_set_border_color(input_, 0xBF9000);
  value_only_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bg_color(value_only_, 0xE7E6E6);
  lx_.format_set_italic(value_only_);
  caution_ = lx_.workbook_add_format(wb_);
  lx_.format_set_bold(caution_);
  lx_.format_set_text_wrap(caution_);
  lx_.format_set_font_color(caution_, 0x9C0006);
}

void Writer::SetProperties() {
  std::string author, client;
  for (const auto& [k, v] : m_.meta) {
    if (k == "prepared") author = v;
    if (k == "client") client = v;
  }
  lxw_doc_properties p{};
  p.title = const_cast<char*>(Keep(m_.title));
  p.subject = const_cast<char*>("Calculation workbook");
  p.author = const_cast<char*>(Keep(author));
  p.company = const_cast<char*>(Keep(client));
  p.comments = const_cast<char*>(
      Keep(fmt::format("Written by heatdeck {} from {}", r_.tool_version, r_.deck_path)));
  p.created = CreatedTime(r_.date);
  Check(lx_.workbook_set_properties(wb_, &p), "setting the document properties");
}

void Writer::QuantityRow(const CaseResult& c, int qi, lxw_worksheet* ws, lxw_row_t row,
                         const std::string& sheet, bool global) {
  const size_t i = static_cast<size_t>(qi);
  const Quantity& q = m_.quantities[i];
  const bool ok = i < c.ok.size() && c.ok[i] && i < c.values.size();
  const double si = ok ? c.values[i] : NAN;
  const std::string& name = names_.quantities[i];

  Text(ws, row, kColSymbol, q.name, bold_);
  Text(ws, row, kColDescription, q.description);
  std::string note;
  if (q.kind == QuantityKind::kGiven) {
    Number(ws, row, kColSi, si, input_);
    const bool overridden =
        std::find(c.overridden.begin(), c.overridden.end(), qi) != c.overridden.end();
    note = fmt::format(
        "Input {} (defined name {}). You may change this value, in {}; every formula that reads "
        "it recalculates.{}{}",
        q.name, name, SiUnitText(q.type.dim),
        overridden ? fmt::format(" Case '{}' sets this value.", c.name) : "",
        q.template_default ? " Template default: the using deck did not bind it." : "");
  } else {
    std::string formula, why;
    if (formulas_.WriteQuantity(qi, &formula, &why)) {
      Formula(ws, row, kColSi, formula, si, nullptr);
    } else {
      Number(ws, row, kColSi, si, value_only_);
      if (q.kind == QuantityKind::kSolved) {
        const SolveDef* sd = nullptr;
        size_t si_index = 0;
        for (size_t s = 0; s < m_.solves.size(); ++s) {
          if (m_.solves[s].unknown == qi) {
            sd = &m_.solves[s];
            si_index = s;
          }
        }
        std::string detail;
        if (sd != nullptr) {
          detail = fmt::format(" between {} and {} {}", xlsx::NumberText(sd->lo),
                               xlsx::NumberText(sd->hi), SiUnitText(q.type.dim));
          if (sd->lhs != nullptr && sd->rhs != nullptr) {
            detail += fmt::format(" so that {} = {}", Pretty(*sd->lhs), Pretty(*sd->rhs));
          }
          if (si_index < c.solves.size()) {
            const SolveResult& res = c.solves[si_index];
            detail += res.converged ? fmt::format(" ({} iterations, residual {})", res.iterations,
                                                  xlsx::NumberText(res.residual_si))
                                    : fmt::format(" (did not converge: {})", res.error);
          }
        }
        note = fmt::format(
            "heatdeck's value, not a formula: {} is found by a bracketed root search{}. A "
            "spreadsheet would need goal seek; this cell does not recalculate when inputs "
            "change.",
            q.name, detail);
      } else {
        note = fmt::format(
            "heatdeck's value, not a formula: {}. This cell does not recalculate when inputs "
            "change; run heatdeck again for new inputs.",
            why);
      }
    }
  }
  if (!note.empty()) Note(ws, row, kColSi, note);
  DefineName(name, sheet, row, kColSi, global);

  Text(ws, row, kColSiUnit, SiUnitText(q.type.dim));
  // (SI - offset) / factor, as the report converts; plain when the unit is SI.
  std::string display = name;
  if (q.display.offset != 0.0) {
    display = fmt::format("{}-{}", name, xlsx::NumberText(q.display.offset));
    if (q.display.factor != 1.0) display = "(" + display + ")";
  }
  if (q.display.factor != 1.0) display += "/" + xlsx::NumberText(q.display.factor);
  Formula(ws, row, kColDisplay, display, ok ? q.display.FromSi(si) : NAN, nullptr);
  Text(ws, row, kColUnit, UnitText(q.display));
  Text(ws, row, kColSource, q.source);

  std::string notes;
  if (i < c.messages.size()) {
    for (const QuantityMessage& msg : c.messages[i]) {
      if (!notes.empty()) notes += "; ";
      notes += fmt::format("{}: {}", KindLabel(msg.kind), msg.text);
    }
  }
  if (q.template_default) notes += notes.empty() ? "template default" : "; template default";
  Text(ws, row, kColNotes, notes);
}

void Writer::CheckRow(const CaseResult& c, size_t k, lxw_worksheet* ws, lxw_row_t row,
                      const std::string& sheet, bool global) {
  const CheckDef& d = m_.checks[k];
  const CheckResult res = k < c.checks.size() ? c.checks[k] : CheckResult{};
  Text(ws, row, kColSymbol, Pretty(*d.expr), bold_);
  // A template's check is marked with its prefix ("[hx] ..."), since its
  // condition reads the template's own names.
  std::string description = d.description;
  if (!d.prefix.empty()) {
    const std::string tag = fmt::format("[{}]", d.prefix.substr(0, d.prefix.size() - 1));
    description = description.empty() ? tag : tag + " " + description;
  }
  Text(ws, row, kColDescription, description);
  const std::string verdict = !res.evaluated ? "#N/A" : res.pass ? "PASS" : "FAIL";
  std::string formula, why;
  if (d.has_sides) {
    const std::string l = Cell(row, kColLhs, false);
    const std::string h = Cell(row, kColRhs, false);
    const auto side = [&](const Expr* e, lxw_col_t col, double v) {
      std::string f, w;
      if (formulas_.Write(e, &f, &w)) {
        Formula(ws, row, col, f, res.evaluated ? v : NAN, nullptr);
      } else {
        Number(ws, row, col, res.evaluated ? v : NAN, value_only_);
        Note(ws, row, col,
             fmt::format("heatdeck's value, not a formula: {}. This cell does not recalculate "
                         "when inputs change.",
                         w));
      }
    };
    side(d.expr->args[0], kColLhs, res.lhs_si);
    side(d.expr->args[1], kColRhs, res.rhs_si);
    Text(ws, row, kColSiUnit, SiUnitText(d.side_unit.dim));
    const std::string near = fmt::format("ABS({0}-{1})<=1E-9*MAX(ABS({0}),ABS({1}))", l, h);
    std::string cond, margin;
    switch (d.expr->kind) {
      case ExprKind::kLt:
      case ExprKind::kLe:
        cond = fmt::format("{}{}{}", l, OperatorText(d.expr->kind), h);
        margin = fmt::format("{}-{}", h, l);
        break;
      case ExprKind::kGt:
      case ExprKind::kGe:
        cond = fmt::format("{}{}{}", l, OperatorText(d.expr->kind), h);
        margin = fmt::format("{}-{}", l, h);
        break;
      case ExprKind::kEq:
        cond = near;
        margin = fmt::format("-ABS({}-{})", l, h);
        break;
      default:  // kNe
        cond = "NOT(" + near + ")";
        margin = fmt::format("ABS({}-{})", l, h);
        break;
    }
    FormulaText(ws, row, kColVerdict, fmt::format("IF({},\"PASS\",\"FAIL\")", cond), verdict,
                bold_);
    Formula(ws, row, kColMargin, margin, res.evaluated ? res.margin_si : NAN, nullptr);
  } else if (formulas_.Write(d.expr, &formula, &why)) {
    FormulaText(ws, row, kColVerdict, fmt::format("IF({},\"PASS\",\"FAIL\")", formula), verdict,
                bold_);
  } else {
    Text(ws, row, kColVerdict, verdict, value_only_);
    Note(ws, row, kColVerdict,
         fmt::format("heatdeck's verdict, not a formula: {}. This cell does not recalculate when "
                     "inputs change.",
                     why));
  }
  DefineName(names_.checks[k], sheet, row, kColVerdict, global);
  if (!res.evaluated) Text(ws, row, kColNotes, "not evaluated: a quantity it reads failed");
}

Writer::CheckRows Writer::CaseSheet(size_t case_index, lxw_worksheet* ws,
                                    const std::string& sheet) {
  const CaseResult& c = r_.cases[case_index];
  const bool global = case_index == 0;
  CheckRows checks;

  lx_.worksheet_set_column(ws, kColSymbol, kColSymbol, 22, nullptr);
  lx_.worksheet_set_column(ws, kColDescription, kColDescription, 40, nullptr);
  lx_.worksheet_set_column(ws, kColSi, kColSi, 18, nullptr);
  lx_.worksheet_set_column(ws, kColSiUnit, kColSiUnit, 12, nullptr);
  lx_.worksheet_set_column(ws, kColDisplay, kColDisplay, 16, nullptr);
  lx_.worksheet_set_column(ws, kColUnit, kColUnit, 12, nullptr);
  lx_.worksheet_set_column(ws, kColSource, kColSource, 30, nullptr);
  lx_.worksheet_set_column(ws, kColNotes, kColNotes, 60, nullptr);

  Text(ws, 0, 0, m_.title.empty() ? r_.deck_path : m_.title, title_);
  Text(ws, 1, 0,
       c.description.empty() ? fmt::format("Case: {}", c.name)
                             : fmt::format("Case: {} ({})", c.name, c.description));
  Text(ws, 2, 0,
       "Yellow cells are inputs: change them and the formulas recalculate. Grey cells hold "
       "heatdeck's values where a spreadsheet has no closed form (see each cell's note).",
       narrative_);
  const char* headers[] = {"Symbol", "Description", "Value (SI)", "SI unit",
                           "Value",  "Unit",        "Source",     "Warnings and notes"};
  for (lxw_col_t col = 0; col < 8; ++col) Text(ws, 4, col, headers[col], header_);
  lx_.worksheet_freeze_panes(ws, kFirstContentRow, 0);
  PrintSetup(ws, kFirstContentRow - 1);

  std::vector<bool> placed_q(m_.quantities.size(), false);
  std::vector<bool> placed_c(m_.checks.size(), false);
  lxw_row_t row = kFirstContentRow;
  bool last_was_check = false;
  const auto check_header = [&] {
    const char* h[] = {"Check",           "Description", "Left side (SI)", "SI unit",
                       "Right side (SI)", "Verdict",     "Margin (SI)",    "Notes"};
    for (lxw_col_t col = 0; col < 8; ++col) Text(ws, row, col, h[col], header_);
    ++row;
  };
  const auto quantity = [&](int qi) {
    if (qi < 0 || placed_q[static_cast<size_t>(qi)]) return;
    placed_q[static_cast<size_t>(qi)] = true;
    QuantityRow(c, qi, ws, row++, sheet, global);
    last_was_check = false;
  };
  const auto check = [&](size_t k) {
    if (placed_c[k]) return;
    placed_c[k] = true;
    if (!last_was_check) check_header();
    if (!checks.any) checks.first = row;
    checks.any = true;
    checks.last = row;
    CheckRow(c, k, ws, row++, sheet, global);
    last_was_check = true;
  };
  const auto section_row = [&](const std::string& title) {
    ++row;  // a blank row before each section
    Text(ws, row, 0, title, section_);
    for (lxw_col_t col = 1; col < 8; ++col) Text(ws, row, col, "", section_);
    ++row;
    last_was_check = false;
  };

  for (const Section& s : m_.sections) {
    if (!report::SectionShown(s)) continue;
    section_row(report::SectionTitle(s));
    for (const Section::Item& item : s.items) {
      switch (item.kind) {
        case Section::Item::Kind::kNarrative:
          Text(ws, row++, 0, m_.narrative[static_cast<size_t>(item.index)], narrative_);
          last_was_check = false;
          break;
        case Section::Item::Kind::kQuantity:
          quantity(item.index);
          break;
        case Section::Item::Kind::kCheck:
          check(static_cast<size_t>(item.index));
          break;
        case Section::Item::Kind::kSolve:
          quantity(m_.solves[static_cast<size_t>(item.index)].unknown);
          break;
        case Section::Item::Kind::kProfile:
          break;
      }
    }
  }
  // Anything no section lists (nothing should be left; the workbook stays
  // complete if the model's sections ever miss an item).
  const bool rest_q = std::find(placed_q.begin(), placed_q.end(), false) != placed_q.end();
  const bool rest_c = std::find(placed_c.begin(), placed_c.end(), false) != placed_c.end();
  if (rest_q || rest_c) section_row("Other quantities and checks");
  for (int qi : m_.order) quantity(qi);
  for (size_t qi = 0; qi < m_.quantities.size(); ++qi) quantity(static_cast<int>(qi));
  for (size_t k = 0; k < m_.checks.size(); ++k) check(k);
  return checks;
}

void Writer::Summary(lxw_worksheet* ws, const std::vector<std::string>& sheets,
                     const std::vector<CheckRows>& check_rows) {
  lx_.worksheet_set_column(ws, 0, 0, 24, nullptr);
  lx_.worksheet_set_column(ws, 1, 1, 60, nullptr);
  lx_.worksheet_set_column(ws, 2, 6, 14, nullptr);
  PrintSetup(ws, 0, false);
  lxw_row_t row = 0;
  Text(ws, row++, 0, m_.title.empty() ? r_.deck_path : m_.title, title_);
  ++row;
  // The title block as every report gives it: the fixed fields, the
  // sign-off roles (blank ones too, to be filled in), then any other key.
  for (const report::MetaField& f : report::TitleFields()) {
    const std::string v = report::MetaValue(r_, f.key);
    if (v.empty()) continue;
    Text(ws, row, 0, f.label, bold_);
    Text(ws, row++, 1, v);
  }
  for (const report::MetaField& f : report::SignOffRoles()) {
    Text(ws, row, 0, f.label, bold_);
    Text(ws, row++, 1, report::MetaValue(r_, f.key));
  }
  for (const auto& [k, v] : m_.meta) {
    if (report::IsPlacedMetaKey(k)) continue;
    Text(ws, row, 0, k, bold_);
    Text(ws, row++, 1, v);
  }
  Text(ws, row, 0, "deck", bold_);
  Text(ws, row++, 1, r_.deck_path);
  Text(ws, row, 0, "written by", bold_);
  Text(ws, row++, 1, fmt::format("heatdeck {}", r_.tool_version));
  for (const InputFile& f : r_.files) {
    Text(ws, row, 0, "input file (SHA-256)", bold_);
    Text(ws, row++, 1, fmt::format("{} ({})", f.path, f.sha256));
  }
  ++row;

  Text(ws, row++, 0, "Checks", title_);
  const char* headers[] = {"Case",   "Sheet",         "Checks",  "Passed",
                           "Failed", "Not evaluated", "Warnings"};
  for (lxw_col_t col = 0; col < 7; ++col) Text(ws, row, col, headers[col], header_);
  ++row;
  const lxw_row_t first_case_row = row;
  int total_failed = 0;
  for (size_t ci = 0; ci < r_.cases.size(); ++ci) {
    const CaseResult& c = r_.cases[ci];
    const report::CheckTally tally = report::Tally(m_, c);
    total_failed += tally.failed;
    Text(ws, row, 0, c.name, bold_);
    Text(ws, row, 1, sheets[ci]);
    Number(ws, row, 2, static_cast<double>(m_.checks.size()), nullptr);
    const CheckRows& cr = check_rows[ci];
    if (cr.any) {
      const std::string range =
          fmt::format("{}!{}:{}", SheetRef(sheets[ci]), Cell(cr.first, kColVerdict, true),
                      Cell(cr.last, kColVerdict, true));
      Formula(ws, row, 3, fmt::format("COUNTIF({},\"PASS\")", range), tally.passed, nullptr);
      Formula(ws, row, 4, fmt::format("COUNTIF({},\"FAIL\")", range), tally.failed, nullptr);
    } else {
      Number(ws, row, 3, 0, nullptr);
      Number(ws, row, 4, 0, nullptr);
    }
    Number(ws, row, 5, tally.not_evaluated, nullptr);
    Number(ws, row, 6, tally.warnings, nullptr);
    ++row;
  }
  ++row;
  Text(ws, row, 0, "Verdict", bold_);
  if (!m_.checks.empty()) {
    const std::string failed_range =
        fmt::format("{}:{}", Cell(first_case_row, 4, true), Cell(row - 2, 4, true));
    FormulaText(ws, row, 1,
                fmt::format("IF(SUM({})=0,\"Every check passes\",\"A check fails\")", failed_range),
                total_failed == 0 ? "Every check passes" : "A check fails", bold_);
  } else {
    Text(ws, row, 1, "The deck has no checks", bold_);
  }
  row += 2;
  lx_.worksheet_set_row(ws, row, 64, nullptr);
  Check(lx_.worksheet_merge_range(ws, row, 0, row, 6, report::kSafetyCaution, caution_),
        "writing the caution");
  row += 2;

  Text(ws, row++, 0, "Reading this workbook", title_);
  const char* lines[] = {
      "Each calculation sheet lists every quantity in the deck's section order: its value in "
      "coherent SI (column C), then converted to its display unit (column E).",
      "Calculated values are live formulas over defined names: each quantity's SI cell is named "
      "after the quantity (Formulas > Name Manager), so a formula reads like the deck.",
      "Yellow cells are inputs and may be changed; every formula that reads them recalculates.",
      "Grey cells hold heatdeck's values where no closed form exists (root searches, iterative "
      "friction factors, IAPWS properties, tables); their notes say why. They do not "
      "recalculate.",
      "Checks show both sides in SI, the verdict and the margin (positive: passes with room) as "
      "formulas.",
  };
  for (const char* line : lines) Text(ws, row++, 0, line);
}

void Writer::SweepSheet(const SweepResult& s, lxw_worksheet* ws, const std::string& sheet) {
  const size_t ncols = s.columns.size();
  std::vector<size_t> swept_col;  // column index of each swept given
  for (int q : s.swept) {
    const auto it = std::find(s.columns.begin(), s.columns.end(), q);
    swept_col.push_back(it == s.columns.end() ? ncols
                                              : static_cast<size_t>(it - s.columns.begin()));
  }
  std::string title = "Sweep of";
  for (size_t k = 0; k < s.swept.size(); ++k) {
    title += (k == 0 ? " " : ", ") + m_.quantities[static_cast<size_t>(s.swept[k])].name;
  }
  Text(ws, 0, 0, title, title_);
  Text(ws, 1, 0,
       "heatdeck's values at each point, in display units (not formulas). The charts plot each "
       "result against the first swept input.",
       narrative_);
  const lxw_row_t header = 3;
  for (size_t k = 0; k < ncols; ++k) {
    const Quantity& q = m_.quantities[static_cast<size_t>(s.columns[k])];
    Text(ws, header, static_cast<lxw_col_t>(k), fmt::format("{} [{}]", q.name, UnitText(q.display)),
         header_);
  }
  Text(ws, header, static_cast<lxw_col_t>(ncols), "Error", header_);
  lx_.worksheet_set_column(ws, 0, static_cast<lxw_col_t>(ncols), 16, nullptr);
  lx_.worksheet_freeze_panes(ws, header + 1, 0);
  PrintSetup(ws, header);

  // Rows in an order where the first swept input varies fastest, so that
  // each combination of the other swept inputs is one contiguous series.
  std::vector<size_t> order(s.rows.size());
  for (size_t p = 0; p < order.size(); ++p) order[p] = p;
  const auto value = [&](size_t p, size_t col) {
    return col < s.rows[p].size() ? s.rows[p][col] : NAN;
  };
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) {
    for (size_t k = 1; k < swept_col.size(); ++k) {
      const double va = value(a, swept_col[k]), vb = value(b, swept_col[k]);
      if (va != vb) return va < vb;
    }
    return false;
  });
  if (order.size() > kMaxSweepRows) {
    Text(
        ws, 2, 0,
        fmt::format("Only the first {} of {} points fit in a sheet; the CSV output holds them all.",
                    kMaxSweepRows, order.size()),
        caution_);
    order.resize(kMaxSweepRows);
  }
  for (size_t n = 0; n < order.size(); ++n) {
    const size_t p = order[n];
    const lxw_row_t row = header + 1 + static_cast<lxw_row_t>(n);
    for (size_t k = 0; k < ncols; ++k) {
      const double si = value(p, k);
      if (std::isfinite(si)) {
        const Quantity& q = m_.quantities[static_cast<size_t>(s.columns[k])];
        Number(ws, row, static_cast<lxw_col_t>(k), q.display.FromSi(si), nullptr);
      }
    }
    if (p < s.row_errors.size()) Text(ws, row, static_cast<lxw_col_t>(ncols), s.row_errors[p]);
  }
  if (swept_col.empty() || swept_col[0] >= ncols || order.empty()) return;

  // Series: runs of rows with equal values of the other swept inputs.
  struct Run {
    size_t begin, end;
    std::string name;
  };
  std::vector<Run> runs;
  for (size_t n = 0; n < order.size();) {
    size_t e = n + 1;
    const auto same = [&](size_t a, size_t b) {
      for (size_t k = 1; k < swept_col.size(); ++k) {
        if (value(order[a], swept_col[k]) != value(order[b], swept_col[k])) return false;
      }
      return true;
    };
    while (e < order.size() && same(n, e)) ++e;
    std::string name;
    for (size_t k = 1; k < swept_col.size(); ++k) {
      const Quantity& q = m_.quantities[static_cast<size_t>(s.swept[k])];
      const double si = value(order[n], swept_col[k]);
      name += fmt::format("{}{} = {} {}", k == 1 ? "" : ", ", q.name,
                          units::FormatSig(q.display.FromSi(si), 4), q.display.text);
    }
    runs.push_back(Run{n, e, name});
    n = e;
  }
  const Quantity& x = m_.quantities[static_cast<size_t>(s.swept[0])];
  const char* sheet_name = Keep(sheet);
  int chart_index = 0;
  for (size_t k = 0; k < ncols; ++k) {
    const int qi = s.columns[k];
    const Quantity& q = m_.quantities[static_cast<size_t>(qi)];
    if (std::find(s.swept.begin(), s.swept.end(), qi) != s.swept.end()) continue;
    if (q.kind == QuantityKind::kGiven) continue;  // constant over the sweep
    lxw_chart* chart = lx_.workbook_add_chart(wb_, LXW_CHART_SCATTER_STRAIGHT_WITH_MARKERS);
    lx_.chart_title_set_name(chart, Keep(q.name));
    lx_.chart_axis_set_name(chart->x_axis,
                            Keep(fmt::format("{} [{}]", x.name, UnitText(x.display))));
    lx_.chart_axis_set_name(chart->y_axis,
                            Keep(fmt::format("{} [{}]", q.name, UnitText(q.display))));
    for (const Run& run : runs) {
      lxw_chart_series* series = lx_.chart_add_series(chart, nullptr, nullptr);
      const lxw_row_t r0 = header + 1 + static_cast<lxw_row_t>(run.begin);
      const lxw_row_t r1 = header + static_cast<lxw_row_t>(run.end);
      lx_.chart_series_set_categories(series, sheet_name, r0, static_cast<lxw_col_t>(swept_col[0]),
                                      r1, static_cast<lxw_col_t>(swept_col[0]));
      lx_.chart_series_set_values(series, sheet_name, r0, static_cast<lxw_col_t>(k), r1,
                                  static_cast<lxw_col_t>(k));
      if (!run.name.empty()) lx_.chart_series_set_name(series, Keep(run.name));
    }
    if (runs.size() == 1) lx_.chart_legend_set_position(chart, LXW_CHART_LEGEND_NONE);
    Check(lx_.worksheet_insert_chart(ws, header + 1 + 16 * static_cast<lxw_row_t>(chart_index),
                                     static_cast<lxw_col_t>(ncols + 2), chart),
          "inserting a chart");
    ++chart_index;
  }
}

bool Writer::Build(std::string* error) {
  MakeStyles();
  SetProperties();
  lxw_worksheet* summary = lx_.workbook_add_worksheet(wb_, "Summary");

  // Sheet names: unique ignoring case, at most 31 characters, none of
  // []:*?/\ (a case name is a deck identifier, so only the length matters).
  std::set<std::string> used = {"SUMMARY"};
  const auto unique_sheet = [&](std::string base) {
    base.resize(std::min<size_t>(base.size(), 31));
    std::string name = base;
    for (int k = 2;; ++k) {
      std::string up = name;
      for (char& ch : up) ch = static_cast<char>(std::toupper(static_cast<unsigned char>(ch)));
      if (used.insert(up).second) return name;
      const std::string suffix = fmt::format(" {}", k);
      name = base.substr(0, std::min(base.size(), 31 - suffix.size())) + suffix;
    }
  };
  std::vector<std::string> sheets;
  std::vector<CheckRows> check_rows;
  for (size_t ci = 0; ci < r_.cases.size(); ++ci) {
    sheets.push_back(unique_sheet(ci == 0 ? "Calculation" : "Case " + r_.cases[ci].name));
    lxw_worksheet* ws = lx_.workbook_add_worksheet(wb_, Keep(sheets.back()));
    if (ws == nullptr) {
      *error = fmt::format("cannot add the sheet '{}'", sheets.back());
      return false;
    }
    check_rows.push_back(CaseSheet(ci, ws, sheets.back()));
  }
  Summary(summary, sheets, check_rows);
  for (size_t k = 0; k < r_.sweeps.size(); ++k) {
    if (r_.sweeps[k].rows.empty()) continue;
    const std::string name = unique_sheet(k == 0 ? "Sweep" : fmt::format("Sweep {}", k + 1));
    lxw_worksheet* ws = lx_.workbook_add_worksheet(wb_, Keep(name));
    if (ws == nullptr) {
      *error = fmt::format("cannot add the sheet '{}'", name);
      return false;
    }
    SweepSheet(r_.sweeps[k], ws, name);
  }
  lx_.worksheet_activate(summary);
  if (!error_.empty()) *error = error_;
  return error_.empty();
}

}  // namespace

bool WriteXlsx(const Results& results, const std::string& path, std::string* error) {
  if (results.model == nullptr || results.cases.empty()) {
    *error = "there are no results to write";
    return false;
  }
  std::string why;
  const xlsx::Library* lx = xlsx::XlsxLibrary(&why);
  if (lx == nullptr) {
    *error = fmt::format("cannot write the workbook {}: {}", path, why);
    return false;
  }
  lxw_workbook* wb = lx->workbook_new(path.c_str());
  if (wb == nullptr) {
    *error = fmt::format("cannot create the workbook {}", path);
    return false;
  }
  bool ok = false;
  {
    Writer w(*lx, results, wb);
    ok = w.Build(error);
    // The writer's strings must outlive workbook_close, which reads them.
    const lxw_error closed = lx->workbook_close(wb);
    if (ok && closed != LXW_NO_ERROR) {
      *error = fmt::format("cannot write the workbook {}: {}", path, lx->lxw_strerror(closed));
      ok = false;
    }
  }
  return ok;
}

}  // namespace heatdeck
