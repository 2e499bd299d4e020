#include "lang/lexer.h"

#include <array>
#include <cerrno>
#include <cmath>
#include <cstdlib>

#include <fmt/format.h>

namespace heatdeck {
namespace {

constexpr std::array<std::string_view, 27> kKeywords = {
    "title", "meta",   "section", "given", "check", "case",   "sweep", "solve", "use",
    "table", "prefer", "in",      "from",  "to",    "step",   "over",  "so",    "that",
    "as",    "with",   "and",     "or",    "not",   "source", "if",    "true",  "false"};

// Words that may follow a literal without being read as its unit.  "in"
// is not among them: right after a number it is the inch.
constexpr std::array<std::string_view, 11> kAfterLiteral = {
    "to", "step", "so", "that", "and", "or", "source", "as", "with", "over", "from"};

bool IsAsciiLetter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
bool IsDigit(char c) { return c >= '0' && c <= '9'; }
bool IsNameChar(char c) { return IsAsciiLetter(c) || IsDigit(c) || c == '_'; }

bool StartsWith(std::string_view s, size_t pos, std::string_view prefix) {
  return s.substr(pos, prefix.size()) == prefix;
}

}  // namespace

bool IsKeyword(std::string_view word) {
  for (auto k : kKeywords) {
    if (k == word) return true;
  }
  return false;
}

Lexer::Lexer(std::string_view file, std::string_view source, Diagnostics& diags)
    : file_(file), src_(source), diags_(diags) {
  if (StartsWith(src_, 0, "\xEF\xBB\xBF")) {
    pos_ = 3;  // a UTF-8 byte-order mark is tolerated
    line_start_ = 3;
  }
  CheckUtf8();
}

// Reports the first invalid UTF-8 sequence of each line.  Text must be
// valid UTF-8 because it ends up in HTML and XLSX documents.
void Lexer::CheckUtf8() {
  int line = 1;
  size_t line_start = 0;
  int reported_line = 0;
  for (size_t i = pos_; i < src_.size();) {
    const auto c = static_cast<unsigned char>(src_[i]);
    if (c == '\n') {
      ++line;
      line_start = i + 1;
      ++i;
      continue;
    }
    if (c < 0x80) {
      ++i;
      continue;
    }
    int len = 0;
    if ((c & 0xE0) == 0xC0 && c >= 0xC2)
      len = 2;
    else if ((c & 0xF0) == 0xE0)
      len = 3;
    else if ((c & 0xF8) == 0xF0 && c <= 0xF4)
      len = 4;
    bool ok = len > 0 && i + static_cast<size_t>(len) <= src_.size();
    for (int k = 1; ok && k < len; ++k) {
      ok = (static_cast<unsigned char>(src_[i + static_cast<size_t>(k)]) & 0xC0) == 0x80;
    }
    if (ok && len == 3) {
      const auto c1 = static_cast<unsigned char>(src_[i + 1]);
      ok = !(c == 0xE0 && c1 < 0xA0) && !(c == 0xED && c1 >= 0xA0);
    }
    if (ok && len == 4) {
      const auto c1 = static_cast<unsigned char>(src_[i + 1]);
      ok = !(c == 0xF0 && c1 < 0x90) && !(c == 0xF4 && c1 >= 0x90);
    }
    if (!ok) {
      if (reported_line != line) {
        const int col = static_cast<int>(i - line_start) + 1;
        diags_.Error(SourceRange{file_, line, col, col},
                     fmt::format("invalid UTF-8 byte 0x{:02X}; decks must be UTF-8 text", c));
        reported_line = line;
      }
      ++i;
      continue;
    }
    i += static_cast<size_t>(len);
  }
}

SourceRange Lexer::RangeAt(size_t begin, size_t end) const {
  const int col = static_cast<int>(begin - line_start_) + 1;
  const int last = end > begin ? static_cast<int>(end - 1 - line_start_) + 1 : col;
  return SourceRange{file_, line_, col, last};
}

void Lexer::SkipBlanks() {
  while (pos_ < src_.size() && (src_[pos_] == ' ' || src_[pos_] == '\t' || src_[pos_] == '\r')) {
    ++pos_;
  }
}

bool Lexer::UnitStartsAt(size_t pos) const {
  if (pos >= src_.size()) return false;
  const char c = src_[pos];
  if (IsAsciiLetter(c)) {
    size_t end = pos;
    while (end < src_.size() && IsNameChar(src_[end])) ++end;
    const std::string_view word = src_.substr(pos, end - pos);
    for (auto k : kAfterLiteral) {
      if (k == word) return false;
    }
    return true;
  }
  if (c == '%') return true;
  if (StartsWith(src_, pos, "\xC2\xB0") || StartsWith(src_, pos, "\xC2\xB5") ||
      StartsWith(src_, pos, "\xCE\xBC") || StartsWith(src_, pos, "\xCE\x94")) {
    return true;  // ° µ μ Δ
  }
  return false;
}

size_t Lexer::UnitRunLength(size_t pos) const {
  size_t end = pos;
  int depth = 0;
  while (end < src_.size()) {
    const char c = src_[end];
    if (c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == ',' || c == '"' || c == '#' ||
        c == '<' || c == '>' || c == '=' || c == '!' || c == '\\') {
      break;
    }
    if (c == '(') ++depth;
    if (c == ')') {
      if (depth == 0) break;
      --depth;
    }
    ++end;
  }
  return end - pos;
}

Token Lexer::LexNumber() {
  const size_t begin = pos_;
  while (pos_ < src_.size() && IsDigit(src_[pos_])) ++pos_;
  if (pos_ < src_.size() && src_[pos_] == '.') {
    ++pos_;
    while (pos_ < src_.size() && IsDigit(src_[pos_])) ++pos_;
  }
  if (pos_ < src_.size() && (src_[pos_] == 'e' || src_[pos_] == 'E')) {
    size_t p = pos_ + 1;
    if (p < src_.size() && (src_[p] == '+' || src_[p] == '-')) ++p;
    if (p < src_.size() && IsDigit(src_[p])) {
      while (p < src_.size() && IsDigit(src_[p])) ++p;
      pos_ = p;
    }
  }
  Token t;
  t.kind = TokKind::kNumber;
  t.text = src_.substr(begin, pos_ - begin);
  t.range = RangeAt(begin, pos_);
  const std::string digits(t.text);
  errno = 0;
  char* end = nullptr;
  t.number = std::strtod(digits.c_str(), &end);
  if (end != digits.c_str() + digits.size() || t.text == ".") {
    diags_.Error(t.range, fmt::format("malformed number '{}'", t.text));
  } else if (errno == ERANGE && std::isinf(t.number)) {
    diags_.Error(t.range, fmt::format("number '{}' is too large for a double", t.text));
    t.number = 0.0;
  }
  // An attached unit: directly after the number, or after one space; a run
  // starting with "1/" (1/m) after the space is a unit too.
  size_t unit_at = std::string_view::npos;
  if (UnitStartsAt(pos_)) {
    unit_at = pos_;
  } else if (pos_ < src_.size() && src_[pos_] == ' ') {
    if (UnitStartsAt(pos_ + 1)) {
      unit_at = pos_ + 1;
    } else if (StartsWith(src_, pos_ + 1, "1/") &&
               (UnitStartsAt(pos_ + 3) || (pos_ + 3 < src_.size() && src_[pos_ + 3] == '('))) {
      unit_at = pos_ + 1;
    }
  }
  if (unit_at != std::string_view::npos) {
    const size_t len = UnitRunLength(unit_at);
    t.unit = src_.substr(unit_at, len);
    t.unit_range = RangeAt(unit_at, unit_at + len);
    pos_ = unit_at + len;
    t.range.last_col = t.unit_range.last_col;
  }
  return t;
}

Token Lexer::LexString() {
  const size_t begin = pos_;
  ++pos_;
  Token t;
  t.kind = TokKind::kString;
  while (pos_ < src_.size() && src_[pos_] != '"' && src_[pos_] != '\n') {
    if (src_[pos_] == '\\' && pos_ + 1 < src_.size() &&
        (src_[pos_ + 1] == '"' || src_[pos_ + 1] == '\\')) {
      t.value += src_[pos_ + 1];
      pos_ += 2;
      continue;
    }
    if (src_[pos_] != '\r') t.value += src_[pos_];
    ++pos_;
  }
  if (pos_ >= src_.size() || src_[pos_] != '"') {
    diags_.Error(RangeAt(begin, begin + 1), "unterminated string: missing closing '\"'");
    t.text = src_.substr(begin + 1, pos_ - begin - 1);
    t.range = RangeAt(begin, pos_);
    return t;
  }
  ++pos_;
  t.text = src_.substr(begin + 1, pos_ - begin - 2);
  t.range = RangeAt(begin, pos_);
  return t;
}

Token Lexer::LexNarrative() {
  const size_t begin = pos_;
  ++pos_;  // '>'
  size_t end = pos_;
  while (end < src_.size() && src_[end] != '\n') ++end;
  Token t;
  t.kind = TokKind::kNarrative;
  t.text = src_.substr(begin, end - begin);
  t.range = RangeAt(begin, end);
  std::string_view body = src_.substr(pos_, end - pos_);
  while (!body.empty() && (body.front() == ' ' || body.front() == '\t')) body.remove_prefix(1);
  while (!body.empty() && (body.back() == ' ' || body.back() == '\t' || body.back() == '\r')) {
    body.remove_suffix(1);
  }
  t.value = std::string(body);
  pos_ = end;
  return t;
}

Token Lexer::NextUnit() {
  SkipBlanks();
  Token t;
  t.kind = TokKind::kUnit;
  const size_t len = UnitRunLength(pos_);
  t.text = src_.substr(pos_, len);
  t.range = RangeAt(pos_, pos_ + len);
  pos_ += len;
  statement_start_ = false;
  return t;
}

Token Lexer::Next() {
  for (;;) {
    SkipBlanks();
    if (pos_ >= src_.size()) {
      if (!statement_start_) {
        statement_start_ = true;
        depth_ = 0;
        Token t;
        t.kind = TokKind::kNewline;
        t.range = RangeAt(pos_, pos_);
        return t;
      }
      Token t;
      t.kind = TokKind::kEof;
      t.range = RangeAt(pos_, pos_);
      return t;
    }
    const char c = src_[pos_];
    if (c == '#') {
      while (pos_ < src_.size() && src_[pos_] != '\n') ++pos_;
      continue;
    }
    if (c == '\\') {
      // A line continuation: only blanks or a comment may follow.
      size_t p = pos_ + 1;
      while (p < src_.size() && (src_[p] == ' ' || src_[p] == '\t' || src_[p] == '\r')) ++p;
      if (p < src_.size() && src_[p] == '#') {
        while (p < src_.size() && src_[p] != '\n') ++p;
      }
      if (p >= src_.size()) {
        pos_ = p;  // at the end of a file without a last newline: no next line
        continue;
      }
      if (src_[p] == '\n') {
        pos_ = p + 1;
        ++line_;
        line_start_ = pos_;
        continue;
      }
      diags_.Error(RangeAt(pos_, pos_ + 1), "'\\' continues a statement only at the end of a line");
      ++pos_;
      continue;
    }
    if (c == '\n') {
      const SourceRange nl_range = RangeAt(pos_, pos_ + 1);
      ++pos_;
      ++line_;
      line_start_ = pos_;
      if (statement_start_) continue;
      if (depth_ > 0) {
        // Inside open parentheses the statement goes on, unless the next
        // line starts in column 1 with a letter or '>': then it is a new
        // statement and the parser reports the unclosed parenthesis.
        const char n = pos_ < src_.size() ? src_[pos_] : '\n';
        if (!(IsAsciiLetter(n) || n == '>')) continue;
      }
      statement_start_ = true;
      depth_ = 0;
      Token t;
      t.kind = TokKind::kNewline;
      t.range = nl_range;
      return t;
    }
    const bool at_start = statement_start_;
    statement_start_ = false;
    if (c == '>' && at_start) return LexNarrative();
    if (IsDigit(c) || (c == '.' && pos_ + 1 < src_.size() && IsDigit(src_[pos_ + 1]))) {
      return LexNumber();
    }
    if (IsAsciiLetter(c) || c == '_') {
      const size_t begin = pos_;
      while (pos_ < src_.size() && IsNameChar(src_[pos_])) ++pos_;
      while (pos_ + 1 < src_.size() && src_[pos_] == '.' &&
             (IsAsciiLetter(src_[pos_ + 1]) || src_[pos_ + 1] == '_')) {
        ++pos_;
        while (pos_ < src_.size() && IsNameChar(src_[pos_])) ++pos_;
      }
      Token t;
      t.kind = TokKind::kIdent;
      t.text = src_.substr(begin, pos_ - begin);
      t.range = RangeAt(begin, pos_);
      return t;
    }
    if (c == '"') return LexString();
    const size_t begin = pos_;
    std::string_view two = src_.substr(pos_, 2);
    if (two == "<=" || two == ">=" || two == "==" || two == "!=") {
      pos_ += 2;
    } else if (c == '+' || c == '-' || c == '*' || c == '/' || c == '^' || c == '(' || c == ')' ||
               c == ',' || c == '=' || c == ':' || c == '<' || c == '>') {
      ++pos_;
      if (c == '(') ++depth_;
      if (c == ')' && depth_ > 0) --depth_;
    } else {
      // One whole UTF-8 character, so the message shows it intact.
      size_t len = 1;
      const auto u = static_cast<unsigned char>(c);
      if (u >= 0xF0)
        len = 4;
      else if (u >= 0xE0)
        len = 3;
      else if (u >= 0xC0)
        len = 2;
      len = std::min(len, src_.size() - pos_);
      // Only continuation bytes belong to it: a broken sequence must not
      // swallow the newline (or anything else) that follows its lead byte.
      for (size_t k = 1; k < len; ++k) {
        if ((static_cast<unsigned char>(src_[pos_ + k]) & 0xC0) != 0x80) {
          len = k;
          break;
        }
      }
      std::string_view ch = src_.substr(pos_, len);
      pos_ += len;
      std::string hint;
      if (ch == "\xC2\xB7" || ch == "\xC3\x97") hint = "; write * to multiply";
      if (ch == "\xC2\xB2" || ch == "\xC2\xB3") hint = "; write ^2 or ^3 for a power";
      if (ch == ";") hint = "; one statement per line";
      const bool printable = u >= 0x20 && u != 0x7F;
      diags_.Error(RangeAt(begin, pos_),
                   printable ? fmt::format("unexpected character '{}'{}", ch, hint)
                             : fmt::format("unexpected control character 0x{:02X}", u));
      statement_start_ = at_start;
      continue;
    }
    Token t;
    t.kind = TokKind::kOp;
    t.text = src_.substr(begin, pos_ - begin);
    t.range = RangeAt(begin, pos_);
    return t;
  }
}

}  // namespace heatdeck
