#include "lang/diagnostics.h"

#include <algorithm>

#include <fmt/format.h>

namespace heatdeck {
namespace {

// Messages quote the deck's text; a megabyte-long name must not make a
// megabyte-long message.  Keeps the head and the tail, cut at UTF-8
// character boundaries.
std::string Bounded(std::string m) {
  constexpr size_t kHead = 300, kTail = 80;
  if (m.size() <= kHead + kTail + 20) return m;
  auto boundary = [&](size_t i) {
    while (i > 0 && i < m.size() && (static_cast<unsigned char>(m[i]) & 0xC0) == 0x80) --i;
    return i;
  };
  const size_t head = boundary(kHead);
  const size_t tail = boundary(m.size() - kTail);
  return m.substr(0, head) + fmt::format("…[{} bytes]…", tail - head) + m.substr(tail);
}

}  // namespace

Diagnostic& Diagnostics::Error(SourceRange r, std::string message) {
  ++errors_;
  list_.push_back(Diagnostic{Severity::kError, r, Bounded(std::move(message)), {}, {}});
  return list_.back();
}

Diagnostic& Diagnostics::Warning(SourceRange r, std::string message) {
  list_.push_back(Diagnostic{Severity::kWarning, r, Bounded(std::move(message)), {}, {}});
  return list_.back();
}

std::vector<const Diagnostic*> Diagnostics::Sorted() const {
  std::vector<const Diagnostic*> v;
  v.reserve(list_.size());
  for (const auto& d : list_) v.push_back(&d);
  std::stable_sort(v.begin(), v.end(), [](const Diagnostic* a, const Diagnostic* b) {
    if (a->range.file != b->range.file) return a->range.file < b->range.file;
    if (a->range.line != b->range.line) return a->range.line < b->range.line;
    return a->range.col < b->range.col;
  });
  return v;
}

std::string_view SourceFiles::Add(std::string name, std::string text) {
  for (const auto& f : files_) {
    if (f->name == name) return f->name;
  }
  files_.push_back(std::make_unique<File>(File{std::move(name), std::move(text)}));
  return files_.back()->name;
}

std::string_view SourceFiles::Text(std::string_view name) const {
  for (const auto& f : files_) {
    if (f->name == name) return f->text;
  }
  return {};
}

std::string_view SourceFiles::Line(std::string_view name, int line) const {
  std::string_view text = Text(name);
  int current = 1;
  size_t start = 0;
  while (current < line) {
    const size_t nl = text.find('\n', start);
    if (nl == std::string_view::npos) return {};
    start = nl + 1;
    ++current;
  }
  size_t end = text.find('\n', start);
  if (end == std::string_view::npos) end = text.size();
  std::string_view out = text.substr(start, end - start);
  if (!out.empty() && out.back() == '\r') out.remove_suffix(1);
  return out;
}

namespace {

const char* SeverityWord(Severity s) {
  switch (s) {
    case Severity::kError:
      return "error";
    case Severity::kWarning:
      return "warning";
    case Severity::kNote:
      return "note";
  }
  return "error";
}

const char* SeverityColour(Severity s) {
  switch (s) {
    case Severity::kError:
      return "\x1b[1;31m";
    case Severity::kWarning:
      return "\x1b[1;35m";
    case Severity::kNote:
      return "\x1b[1;36m";
  }
  return "";
}

// The source line with a caret under [col, last_col].  Tabs in the prefix are
// kept so that the caret lines up in a terminal.  Lines longer than 200
// characters are cut around the span.
void AppendQuote(std::string& out, std::string_view line, int col, int last_col, bool colour) {
  if (col < 1) return;
  size_t begin = 0;
  std::string_view shown = line;
  const size_t kMax = 200;
  if (line.size() > kMax && static_cast<size_t>(col) > kMax / 2) {
    // Centred on the column, but never past the line's last kMax bytes (a
    // column may point just past the end of its line).
    begin = std::min(static_cast<size_t>(col) - kMax / 2, line.size() - kMax);
    shown = line.substr(begin, kMax);
  } else if (line.size() > kMax) {
    shown = line.substr(0, kMax);
  }
  // The line and its caret are appended whole and then mended in place:
  // every diagnostic quotes up to 200 bytes, and a deck of garbage gives
  // one diagnostic per bad byte.
  out += "  ";
  const size_t quote_at = out.size();
  out.append(shown);
  // Control bytes (an escape sequence could clear or recolour the
  // terminal) are shown as '?'; tabs stay so that the caret lines up.
  std::replace_if(
      out.begin() + static_cast<std::ptrdiff_t>(quote_at), out.end(),
      [](char c) {
        const auto u = static_cast<unsigned char>(c);
        return (u < 0x20 && c != '\t') || u == 0x7F;
      },
      '?');
  out += '\n';
  out += "  ";
  // Columns count bytes; a terminal shows characters, so UTF-8
  // continuation bytes take no place under the line.
  auto continuation = [](char c) { return (static_cast<unsigned char>(c) & 0xC0) == 0x80; };
  const size_t caret_at = std::min(static_cast<size_t>(col - 1) - begin, shown.size());
  const size_t pad_at = out.size();
  out.append(shown.substr(0, caret_at));
  out.erase(
      std::remove_if(out.begin() + static_cast<std::ptrdiff_t>(pad_at), out.end(), continuation),
      out.end());
  std::replace_if(
      out.begin() + static_cast<std::ptrdiff_t>(pad_at), out.end(),
      [](char c) { return c != '\t'; }, ' ');
  if (colour) out += "\x1b[1;32m";
  out += '^';
  const size_t last = static_cast<size_t>(std::max(last_col, col)) - begin;
  if (last > caret_at + 1) {
    const std::string_view under =
        shown.substr(std::min(caret_at + 1, shown.size()),
                     std::min(last, shown.size()) - std::min(caret_at + 1, shown.size()));
    out.append(static_cast<size_t>(std::count_if(under.begin(), under.end(),
                                                 [&](char c) { return !continuation(c); })),
               '~');
  }
  if (colour) out += "\x1b[0m";
  out += '\n';
}

}  // namespace

std::string Render(const Diagnostic& d, const SourceFiles& files, bool colour) {
  std::string out;
  if (colour) out += "\x1b[1m";
  if (!d.range.file.empty()) {
    out += d.range.valid() ? fmt::format("{}:{}:{}: ", d.range.file, d.range.line, d.range.col)
                           : fmt::format("{}: ", d.range.file);
  } else {
    out += "heatdeck: ";
  }
  if (colour) out += "\x1b[0m";
  if (colour) out += SeverityColour(d.severity);
  out += SeverityWord(d.severity);
  out += ":";
  if (colour) out += "\x1b[0m";
  out += " ";
  out += d.message;
  out += '\n';
  if (d.range.valid()) {
    AppendQuote(out, files.Line(d.range.file, d.range.line), d.range.col, d.range.last_col, colour);
  }
  for (const auto& [range, text] : d.related) {
    out += range.valid()
               ? fmt::format("{}:{}:{}: note: {}\n", range.file, range.line, range.col, text)
               : fmt::format("note: {}\n", text);
    if (range.valid()) {
      AppendQuote(out, files.Line(range.file, range.line), range.col, range.last_col, colour);
    }
  }
  for (const auto& n : d.notes) {
    out += "  note: ";
    out += n;
    out += '\n';
  }
  return out;
}

}  // namespace heatdeck
