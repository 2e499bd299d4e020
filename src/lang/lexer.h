// The deck lexer.  It is driven by the parser one token at a time, because
// a unit after `in` or `prefer` is read as one run of characters rather
// than as operators (LANGUAGE.md "Quantities and units").
#pragma once

#include <string>
#include <string_view>

#include "lang/diagnostics.h"

namespace heatdeck {

enum class TokKind {
  kIdent,      // name, possibly dotted: T_h1, hx.Q, oil.cp
  kNumber,     // number with an optional attached unit
  kString,     // "…", text holds the decoded contents
  kOp,         // + - * / ^ ( ) , = : < <= > >= == !=
  kUnit,       // a unit run read by NextUnit()
  kNarrative,  // `> text` at the start of a statement; text is the rest of the line
  kNewline,    // end of a statement
  kEof,
};

struct Token {
  TokKind kind = TokKind::kEof;
  std::string_view text;  // source spelling (kString: without the quotes)
  SourceRange range;
  std::string value;      // kString: decoded text; kNarrative: trimmed text
  double number = 0.0;    // kNumber
  std::string_view unit;  // kNumber: attached unit ("" when none)
  SourceRange unit_range;
  bool Is(TokKind k, std::string_view t) const { return kind == k && text == t; }
};

class Lexer {
 public:
  // file must outlive the lexer and every token (it is the SourceFiles name).
  Lexer(std::string_view file, std::string_view source, Diagnostics& diags);

  // The next token.  Statement ends become kNewline: a line end outside
  // parentheses and not after '\'.  Errors are reported and skipped.
  Token Next();
  // Reads one unit run at the current position (after optional blanks): up
  // to a blank, ',', '"', '#', or a ')' that it did not open.  Returns a
  // kUnit token, empty when nothing is there.
  Token NextUnit();

 private:
  SourceRange RangeAt(size_t begin, size_t end) const;
  void SkipBlanks();
  bool AtLineStart() const;
  Token LexNumber();
  Token LexString();
  Token LexNarrative();
  // Length of a unit run starting at pos (0 when none).
  size_t UnitRunLength(size_t pos) const;
  bool UnitStartsAt(size_t pos) const;
  void CheckUtf8();

  std::string_view file_;
  std::string_view src_;
  Diagnostics& diags_;
  size_t pos_ = 0;
  int line_ = 1;
  size_t line_start_ = 0;
  int depth_ = 0;                // open parentheses in the current statement
  bool statement_start_ = true;  // nothing but blanks since the last statement end
};

// True for words that cannot name a quantity.
bool IsKeyword(std::string_view word);

}  // namespace heatdeck
