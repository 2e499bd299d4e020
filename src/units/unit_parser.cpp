// Recursive-descent parser for unit expressions:
//
//   product := term (('*' | '·' | '⋅' | '/') term)*
//   term    := primary [exponent]
//   primary := symbol | '1' | '(' product ')'
//   exponent := '^' integer | '^(' integer ')' | superscript digits ('⁻¹', '²')
//
// Operators associate to the left ("J/kg*K" is (J/kg)*K).  ASCII spaces
// between tokens are ignored.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <string>
#include <string_view>

#include <fmt/format.h>

#include "units/unit.h"
#include "units/unit_registry.h"

namespace heatdeck::units {
namespace {

// Dimension exponents are int8; anything beyond this is a typo, and the
// bound keeps every intermediate product far from overflow.
constexpr int kMaxExponent = 60;
// Bounds the recursion on hostile input; real units nest two or three deep.
constexpr int kMaxDepth = 32;

struct Term {
  Dimension dim;
  double factor = 1.0;
};

bool IsAsciiLetter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
bool IsDigit(char c) { return c >= '0' && c <= '9'; }

// Byte length of the UTF-8 sequence starting with `lead` (1 for stray bytes).
size_t Utf8Length(char lead) {
  const auto b = static_cast<unsigned char>(lead);
  if (b >= 0xF0) return 4;
  if (b >= 0xE0) return 3;
  if (b >= 0xC0) return 2;
  return 1;
}

// Non-ASCII characters that may appear inside a unit symbol.
constexpr std::string_view kSymbolChars[] = {
    "\xC2\xB0",      // ° degree
    "\xCE\x94",      // Δ
    "\xC2\xB5",      // µ micro sign
    "\xCE\xBC",      // μ Greek mu
    "\xE2\x84\x83",  // ℃
    "\xE2\x84\x89",  // ℉
};
constexpr std::string_view kMultiplyChars[] = {
    "\xC2\xB7",      // · middle dot
    "\xE2\x8B\x85",  // ⋅ dot operator
};
constexpr std::string_view kSuperMinus = "\xE2\x81\xBB";  // ⁻
constexpr std::string_view kMinusSign = "\xE2\x88\x92";   // − U+2212
constexpr std::string_view kSuperDigits[] = {
    "\xE2\x81\xB0", "\xC2\xB9",     "\xC2\xB2",     "\xC2\xB3",     "\xE2\x81\xB4",
    "\xE2\x81\xB5", "\xE2\x81\xB6", "\xE2\x81\xB7", "\xE2\x81\xB8", "\xE2\x81\xB9",
};

bool CheckedCombine(const Dimension& a, const Dimension& b, int b_power, Dimension* out) {
  for (int i = 0; i < kNumBase; ++i) {
    const int e = a.exp(i) + b.exp(i) * b_power;
    if (e > kMaxExponent || e < -kMaxExponent) return false;
  }
  *out = a * b.Pow(b_power);
  return true;
}

class Parser {
 public:
  Parser(std::string_view text, UnitError* error) : text_(text), error_(error) {}

  bool Run(Unit* out) {
    SkipSpace();
    if (AtEnd()) return Fail("empty unit", 0, text_.empty() ? 1 : text_.size());
    Term t;
    if (!ParseProduct(&t)) return false;
    if (!AtEnd()) return FailUnexpected();

    Unit u;
    u.text = std::move(canon_);
    u.dim = t.dim;
    u.factor = t.factor;
    const bool bare = symbols_ == 1 && !compound_;
    if (bare) {
      switch (last_def_->temp) {
        case TempRole::kScale:
          u.offset = last_def_->offset;
          u.kind = TempKind::kAbsolute;
          break;
        case TempRole::kInterval:
          u.kind = TempKind::kInterval;
          break;
        case TempRole::kEither:
          u.kind = TempKind::kEither;
          break;
        case TempRole::kNone:
          break;
      }
    } else if (u.dim.IsTemperature()) {
      // A compound reduced to Θ¹ ("W/(W/K)", "degC*m/m"): any Celsius or
      // Fahrenheit symbol in it was read as an interval, so the whole is one;
      // built from K and R alone it stays either.
      u.kind = celsius_like_ ? TempKind::kInterval : TempKind::kEither;
    }
    *out = std::move(u);
    return true;
  }

 private:
  bool AtEnd() const { return pos_ >= text_.size(); }
  std::string_view Rest() const { return text_.substr(pos_); }

  void SkipSpace() {
    while (!AtEnd() && (text_[pos_] == ' ' || text_[pos_] == '\t')) ++pos_;
  }

  bool Fail(std::string message, size_t offset, size_t length) {
    error_->message = std::move(message);
    error_->offset = static_cast<int>(offset);
    error_->length = static_cast<int>(length == 0 ? 1 : length);
    return false;
  }

  // Length of a multiplication operator at pos_, or 0.
  size_t MultiplyAt() const {
    if (AtEnd()) return 0;
    if (text_[pos_] == '*') return 1;
    for (std::string_view m : kMultiplyChars) {
      if (Rest().starts_with(m)) return m.size();
    }
    return 0;
  }

  // Length of a symbol character at `at`, or 0.
  size_t SymbolCharAt(size_t at) const {
    if (at >= text_.size()) return 0;
    if (IsAsciiLetter(text_[at])) return 1;
    const std::string_view rest = text_.substr(at);
    for (std::string_view s : kSymbolChars) {
      if (rest.starts_with(s)) return s.size();
    }
    return 0;
  }

  bool StartsPrimary() const {
    if (AtEnd()) return false;
    const char c = text_[pos_];
    return c == '(' || c == '%' || IsDigit(c) || SymbolCharAt(pos_) > 0;
  }

  // Called where an operator or the end was expected.
  bool FailUnexpected() {
    const char c = text_[pos_];
    if (c == ')') return Fail("unmatched ')'", pos_, 1);
    if (StartsPrimary()) {
      return Fail("missing '*' or '/' between units", pos_, 1);
    }
    if (c == '^') return Fail("unexpected '^'", pos_, 1);
    const size_t n = std::min(Utf8Length(c), text_.size() - pos_);
    return Fail(fmt::format("unexpected character '{}'", text_.substr(pos_, n)), pos_, n);
  }

  bool FailFactorRange(size_t start) {
    return Fail("unit factor out of range", start, pos_ - start);
  }

  bool ParseProduct(Term* out) {
    const size_t start = pos_;
    if (!ParseTerm(out)) return false;
    for (;;) {
      SkipSpace();
      bool divide = false;
      size_t op_len = MultiplyAt();
      if (op_len == 0 && !AtEnd() && text_[pos_] == '/') {
        divide = true;
        op_len = 1;
      }
      if (op_len == 0) return true;
      compound_ = true;
      last_op_ = text_.substr(pos_, op_len);
      canon_ += divide ? '/' : '*';
      pos_ += op_len;
      SkipSpace();
      Term rhs;
      if (!ParseTerm(&rhs)) return false;
      if (!CheckedCombine(out->dim, rhs.dim, divide ? -1 : 1, &out->dim)) {
        return Fail("exponent too large", start, pos_ - start);
      }
      out->factor = divide ? out->factor / rhs.factor : out->factor * rhs.factor;
      if (!std::isnormal(out->factor)) return FailFactorRange(start);
    }
  }

  bool ParseTerm(Term* out) {
    const size_t start = pos_;
    if (!ParsePrimary(out)) return false;
    int power = 1;
    bool has_power = false;
    if (!AtEnd() && text_[pos_] == '^') {
      if (!ParseCaretExponent(&power)) return false;
      has_power = true;
    } else if (Rest().starts_with(kSuperMinus) || SuperDigitAt(pos_) >= 0) {
      if (!ParseSuperscriptExponent(&power)) return false;
      has_power = true;
    } else if (!AtEnd() && IsDigit(text_[pos_])) {
      size_t end = pos_;
      while (end < text_.size() && IsDigit(text_[end])) ++end;
      return Fail(fmt::format("missing '^' before exponent '{}'", text_.substr(pos_, end - pos_)),
                  pos_, end - pos_);
    }
    if (!has_power) return true;
    compound_ = true;
    canon_ += fmt::format("^{}", power);
    Dimension d;
    if (!CheckedCombine(Dimension(), out->dim, power, &d)) {
      return Fail("exponent too large", start, pos_ - start);
    }
    out->dim = d;
    out->factor = std::pow(out->factor, power);
    if (!std::isnormal(out->factor)) return FailFactorRange(start);
    return true;
  }

  int SuperDigitAt(size_t at) const {
    const std::string_view rest = text_.substr(at);
    for (int i = 0; i < 10; ++i) {
      if (rest.starts_with(kSuperDigits[i])) return i;
    }
    return -1;
  }

  // Reads a decimal integer; returns the number of digits read.
  int ReadDigits(int* value) {
    int count = 0;
    int v = 0;
    while (!AtEnd() && IsDigit(text_[pos_])) {
      // Saturate: past two digits the exponent is rejected anyway.
      if (count < 3) v = v * 10 + (text_[pos_] - '0');
      ++count;
      ++pos_;
    }
    *value = v;
    return count;
  }

  bool ParseCaretExponent(int* power) {
    const size_t caret = pos_;
    ++pos_;
    auto fail = [&] { return Fail("expected an integer exponent after '^'", caret, 1); };
    const bool paren = !AtEnd() && text_[pos_] == '(';
    if (paren) ++pos_;
    int sign = 1;
    if (!AtEnd() && (text_[pos_] == '-' || text_[pos_] == '+')) {
      sign = text_[pos_] == '-' ? -1 : 1;
      ++pos_;
    } else if (Rest().starts_with(kMinusSign)) {
      sign = -1;
      pos_ += kMinusSign.size();
    }
    int v = 0;
    const int digits = ReadDigits(&v);
    if (digits == 0) return fail();
    if (digits > 2) return Fail("exponent too large", caret, pos_ - caret);
    if (paren) {
      if (AtEnd() || text_[pos_] != ')') return fail();
      ++pos_;
    }
    // "m^2.5" is no integer exponent; say so rather than "unexpected '.'".
    if (!AtEnd() && text_[pos_] == '.') return fail();
    *power = sign * v;
    return true;
  }

  bool ParseSuperscriptExponent(int* power) {
    const size_t begin = pos_;
    int sign = 1;
    if (Rest().starts_with(kSuperMinus)) {
      sign = -1;
      pos_ += kSuperMinus.size();
    }
    int v = 0;
    int count = 0;
    for (int d = SuperDigitAt(pos_); d >= 0; d = SuperDigitAt(pos_)) {
      v = v * 10 + d;
      pos_ += kSuperDigits[d].size();
      if (++count > 2) return Fail("exponent too large", begin, pos_ - begin);
    }
    if (count == 0) {
      return Fail("expected a superscript digit after '\xE2\x81\xBB'", begin, pos_ - begin);
    }
    *power = sign * v;
    return true;
  }

  bool ParsePrimary(Term* out) {
    if (AtEnd()) {
      if (last_op_.empty()) return Fail("empty unit", pos_, 1);
      return Fail(fmt::format("expected a unit after '{}'", last_op_), pos_, 1);
    }
    const char c = text_[pos_];
    if (c == '(') {
      const size_t open = pos_;
      if (++depth_ > kMaxDepth) return Fail("parentheses nested too deeply", open, 1);
      ++pos_;
      canon_ += '(';
      SkipSpace();
      if (!ParseProduct(out)) return false;
      SkipSpace();
      if (AtEnd()) return Fail("unclosed '('", open, 1);
      if (text_[pos_] != ')') return FailUnexpected();
      ++pos_;
      --depth_;
      canon_ += ')';
      return true;
    }
    if (IsDigit(c)) {
      size_t end = pos_;
      while (end < text_.size() && (IsDigit(text_[end]) || text_[end] == '.')) ++end;
      const std::string_view number = text_.substr(pos_, end - pos_);
      if (number != "1") {
        return Fail(fmt::format("unexpected number '{}' in a unit", number), pos_, end - pos_);
      }
      pos_ = end;
      compound_ = true;
      canon_ += '1';
      *out = Term{};
      return true;
    }
    if (c == '%' || SymbolCharAt(pos_) > 0) return ParseSymbol(out);
    if (c == ')' || c == '/' || c == '^' || MultiplyAt() > 0) {
      const size_t n = c == ')' || c == '/' || c == '^' ? 1 : MultiplyAt();
      return Fail(fmt::format("expected a unit before '{}'", text_.substr(pos_, n)), pos_, n);
    }
    const size_t n = std::min(Utf8Length(c), text_.size() - pos_);
    return Fail(fmt::format("unexpected character '{}'", text_.substr(pos_, n)), pos_, n);
  }

  bool ParseSymbol(Term* out) {
    const size_t begin = pos_;
    if (text_[pos_] == '%') {
      ++pos_;
    } else {
      for (size_t n = SymbolCharAt(pos_); n > 0; n = SymbolCharAt(pos_)) pos_ += n;
    }
    const std::string_view raw = text_.substr(begin, pos_ - begin);
    std::string ascii;
    const bool clean = NormalizeSymbol(raw, &ascii);
    const SymbolMatch match = clean ? LookupSymbol(ascii) : SymbolMatch{};
    if (match.def == nullptr) {
      std::string message = fmt::format("unknown unit '{}'", raw);
      if (match.unprefixable != nullptr) {
        message += fmt::format(" ('{}' takes no SI prefix)", match.unprefixable->symbol);
      } else if (const auto s = SuggestUnits(raw); !s.empty()) {
        message += fmt::format("; did you mean '{}'?", s.front());
      }
      return Fail(std::move(message), begin, raw.size());
    }
    ++symbols_;
    last_def_ = match.def;
    if (match.def->temp == TempRole::kScale || match.def->temp == TempRole::kInterval) {
      celsius_like_ = true;
    }
    canon_ += ascii;
    out->dim = match.def->dim;
    out->factor = match.def->factor * (match.prefix ? match.prefix->factor : 1.0);
    return true;
  }

  std::string_view text_;
  UnitError* error_;
  size_t pos_ = 0;
  std::string canon_;
  std::string_view last_op_;
  int symbols_ = 0;
  int depth_ = 0;
  bool compound_ = false;  // an operator, an exponent or a '1' was seen
  bool celsius_like_ = false;
  const UnitDef* last_def_ = nullptr;
};

}  // namespace

bool ParseUnit(std::string_view text, Unit* out, UnitError* error) {
  UnitError scratch;
  Parser parser(text, error != nullptr ? error : &scratch);
  return parser.Run(out);
}

}  // namespace heatdeck::units
