#include "lang/parser.h"

#include <algorithm>
#include <vector>

#include <fmt/format.h>

#include "lang/lexer.h"

namespace heatdeck {
namespace {

SourceRange Span(SourceRange a, SourceRange b) {
  if (a.line == b.line && b.last_col >= a.col) a.last_col = b.last_col;
  return a;
}

class Parser {
 public:
  Parser(std::string_view file, std::string_view source, Diagnostics& diags,
         const ParseLimits& limits)
      : lex_(file, source, diags), diags_(diags), limits_(limits) {
    deck_.file = file;
    Advance();
  }

  Deck Run() {
    while (cur_.kind != TokKind::kEof) {
      if (cur_.kind == TokKind::kNewline) {
        Advance();
        continue;
      }
      if (static_cast<int>(deck_.stmts.size()) >= limits_.max_statements) {
        diags_.Error(cur_.range, fmt::format("too many statements (limit {}); raise it with "
                                             "--max-statements",
                                             limits_.max_statements));
        break;
      }
      const int errors_before = diags_.error_count();
      ParseStatement();
      if (cur_.kind != TokKind::kNewline && cur_.kind != TokKind::kEof) {
        if (diags_.error_count() == errors_before) {
          Diagnostic& d = diags_.Error(
              cur_.range, fmt::format("unexpected {} at the end of the statement", Describe(cur_)));
          if (prev_.kind == TokKind::kNumber && prev_.unit == "in") {
            d.notes.push_back(fmt::format(
                "right after a number, 'in' is the inch; to show the result in {0}, end the "
                "expression with a name or a parenthesis: (… {1}) in {0}",
                cur_.text, prev_.text));
          }
        }
        SkipStatement();
      }
    }
    return std::move(deck_);
  }

 private:
  void Advance() {
    prev_ = std::move(cur_);
    cur_ = lex_.Next();
  }

  void SkipStatement() {
    while (cur_.kind != TokKind::kNewline && cur_.kind != TokKind::kEof) Advance();
  }

  static std::string Describe(const Token& t) {
    switch (t.kind) {
      case TokKind::kIdent:
        return fmt::format("'{}'", t.text);
      case TokKind::kNumber:
        return fmt::format("number '{}'", t.text);
      case TokKind::kString:
        return "string";
      case TokKind::kOp:
        return fmt::format("'{}'", t.text);
      case TokKind::kUnit:
        return fmt::format("unit '{}'", t.text);
      case TokKind::kNarrative:
        return "narrative";
      case TokKind::kNewline:
        return "end of line";
      case TokKind::kEof:
        return "end of file";
    }
    return "token";
  }

  // Reports "expected X, found Y" once per statement; returns false.
  bool Fail(std::string_view what) {
    diags_.Error(cur_.range, fmt::format("expected {}, found {}", what, Describe(cur_)));
    SkipStatement();
    return false;
  }

  bool ExpectOp(std::string_view op) {
    if (cur_.Is(TokKind::kOp, op)) {
      Advance();
      return true;
    }
    return Fail(fmt::format("'{}'", op));
  }

  bool AtWord(std::string_view w) const { return cur_.Is(TokKind::kIdent, w); }

  bool ExpectWord(std::string_view w) {
    if (AtWord(w)) {
      Advance();
      return true;
    }
    return Fail(fmt::format("'{}'", w));
  }

  // A quantity (or case, prefix, table) name: not a keyword, not dotted.
  bool ExpectName(std::string_view* name, SourceRange* range, std::string_view what) {
    if (cur_.kind != TokKind::kIdent) return Fail(what);
    if (IsKeyword(cur_.text)) {
      diags_.Error(cur_.range,
                   fmt::format("'{}' is a keyword and cannot be used as {}", cur_.text, what));
      SkipStatement();
      return false;
    }
    if (cur_.text.find('.') != std::string_view::npos) {
      diags_.Error(cur_.range,
                   fmt::format("'{}': a dot belongs to template and table names; {} cannot "
                               "contain one",
                               cur_.text, what));
      SkipStatement();
      return false;
    }
    *name = cur_.text;
    *range = cur_.range;
    Advance();
    return true;
  }

  bool ExpectString(std::string* out, SourceRange* range, std::string_view what) {
    if (cur_.kind != TokKind::kString) return Fail(what);
    *out = cur_.value;
    *range = cur_.range;
    Advance();
    return true;
  }

  // Description and `source "…"`, in any order.
  void ParseAttrs(Attrs& attrs) {
    for (;;) {
      if (cur_.kind == TokKind::kString) {
        if (attrs.description_range.valid()) {
          diags_.Error(cur_.range, "a statement has one description; this is a second");
        }
        attrs.description = cur_.value;
        attrs.description_range = cur_.range;
        Advance();
      } else if (AtWord("source")) {
        const SourceRange kw = cur_.range;
        Advance();
        if (cur_.kind != TokKind::kString) {
          Fail("a quoted text after 'source'");
          return;
        }
        if (attrs.source_range.valid()) {
          diags_.Error(cur_.range, "a statement has one source; this is a second");
        }
        attrs.source = cur_.value;
        attrs.source_range = Span(kw, cur_.range);
        Advance();
      } else {
        return;
      }
    }
  }

  void ParseStatement() {
    Stmt s;
    s.range = cur_.range;
    if (cur_.kind == TokKind::kNarrative) {
      s.kind = StmtKind::kNarrative;
      s.text = cur_.value;
      s.text_range = cur_.range;
      Advance();
      deck_.stmts.push_back(std::move(s));
      return;
    }
    if (cur_.kind != TokKind::kIdent) {
      Fail("a statement");
      return;
    }
    const std::string_view word = cur_.text;
    bool ok = false;
    if (word == "title")
      ok = ParseTitle(s, StmtKind::kTitle);
    else if (word == "section")
      ok = ParseTitle(s, StmtKind::kSection);
    else if (word == "meta")
      ok = ParseMeta(s);
    else if (word == "given")
      ok = ParseGiven(s);
    else if (word == "check")
      ok = ParseCheck(s);
    else if (word == "case")
      ok = ParseCase(s);
    else if (word == "sweep")
      ok = ParseSweep(s);
    else if (word == "solve")
      ok = ParseSolve(s);
    else if (word == "use")
      ok = ParseUse(s);
    else if (word == "table")
      ok = ParseTable(s);
    else if (word == "prefer")
      ok = ParsePrefer(s);
    else if (word == "profile")
      ok = ParseProfile(s);
    else
      ok = ParseCalc(s);
    if (ok) deck_.stmts.push_back(std::move(s));
  }

  bool ParseTitle(Stmt& s, StmtKind kind) {
    s.kind = kind;
    Advance();
    return ExpectString(&s.text, &s.text_range, "a quoted text");
  }

  bool ParseMeta(Stmt& s) {
    s.kind = StmtKind::kMeta;
    Advance();
    if (cur_.kind != TokKind::kIdent) return Fail("a field name after 'meta'");
    s.name = cur_.text;
    s.name_range = cur_.range;
    Advance();
    return ExpectString(&s.text, &s.text_range, "a quoted text");
  }

  bool ParseGiven(Stmt& s) {
    s.kind = StmtKind::kGiven;
    Advance();
    if (!ExpectName(&s.name, &s.name_range, "a quantity name")) return false;
    if (!ExpectOp("=")) return false;
    s.expr = ParseLiteral("a literal value such as 0.5 kg/s");
    if (s.expr == nullptr) return false;
    ParseAttrs(s.attrs);
    return true;
  }

  // A literal: an optionally negated number with its unit.  Anything else is
  // reported; the caller gives the context in `what`.
  const Expr* ParseLiteral(std::string_view what) {
    const SourceRange start = cur_.range;
    bool negative = false;
    if (cur_.Is(TokKind::kOp, "-") || cur_.Is(TokKind::kOp, "+")) {
      negative = cur_.text == "-";
      Advance();
    }
    if (cur_.kind != TokKind::kNumber) {
      if (cur_.kind == TokKind::kIdent || cur_.Is(TokKind::kOp, "(")) {
        diags_.Error(cur_.range,
                     fmt::format("expected {}: this takes a number with its unit, not an "
                                 "expression (write a calculated quantity instead)",
                                 what));
        SkipStatement();
        return nullptr;
      }
      Fail(what);
      return nullptr;
    }
    const Expr* num = MakeNumber();
    if (!negative) return num;
    Expr& neg = deck_.NewExpr(ExprKind::kNeg, Span(start, num->range));
    neg.args.push_back(num);
    return &neg;
  }

  const Expr* MakeNumber() {
    Expr& e = deck_.NewExpr(ExprKind::kNumber, cur_.range);
    e.text = cur_.text;
    e.number = cur_.number;
    e.unit = cur_.unit;
    e.unit_range = cur_.unit_range;
    Advance();
    return &e;
  }

  bool ParseCheck(Stmt& s) {
    s.kind = StmtKind::kCheck;
    Advance();
    s.expr = ParseExpr();
    if (s.expr == nullptr) return false;
    if (!IsComparison(s.expr->kind) && !IsLogical(s.expr->kind)) {
      if (cur_.Is(TokKind::kOp, "=")) {
        diags_.Error(cur_.range, "a check compares with ==, not =");
        SkipStatement();
        return false;
      }
      diags_.Error(s.expr->range, "a check needs a comparison such as 'T_h2 <= 45 degC'");
      SkipStatement();
      return false;
    }
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParseCase(Stmt& s) {
    s.kind = StmtKind::kCase;
    Advance();
    if (!ExpectName(&s.name, &s.name_range, "a case name")) return false;
    if (cur_.kind == TokKind::kString) {
      s.attrs.description = cur_.value;
      s.attrs.description_range = cur_.range;
      Advance();
    }
    if (!ExpectOp(":")) return false;
    for (;;) {
      Binding b;
      if (!ExpectName(&b.name, &b.name_range, "an input name")) return false;
      if (!ExpectOp("=")) return false;
      b.value = ParseLiteral("a literal value");
      if (b.value == nullptr) return false;
      s.bindings.push_back(b);
      if (!cur_.Is(TokKind::kOp, ",")) break;
      Advance();
    }
    return true;
  }

  bool ParseSweep(Stmt& s) {
    s.kind = StmtKind::kSweep;
    Advance();
    if (!ExpectName(&s.name, &s.name_range, "an input name")) return false;
    if (AtWord("from")) {
      Advance();
      if ((s.from = ParseLiteral("a literal start value")) == nullptr) return false;
      if (!ExpectWord("to")) return false;
      if ((s.to = ParseLiteral("a literal end value")) == nullptr) return false;
      if (!ExpectWord("step")) return false;
      if ((s.step = ParseLiteral("a literal step")) == nullptr) return false;
    } else if (AtWord("over")) {
      Advance();
      for (;;) {
        const Expr* v = ParseLiteral("a literal value");
        if (v == nullptr) return false;
        s.over.push_back(v);
        if (!cur_.Is(TokKind::kOp, ",")) break;
        Advance();
      }
    } else {
      return Fail("'from' or 'over'");
    }
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParseSolve(Stmt& s) {
    s.kind = StmtKind::kSolve;
    Advance();
    if (!ExpectName(&s.name, &s.name_range, "the unknown's name")) return false;
    if (!ExpectWord("from")) return false;
    if ((s.from = ParseLiteral("a literal lower bound")) == nullptr) return false;
    if (!ExpectWord("to")) return false;
    if ((s.to = ParseLiteral("a literal upper bound")) == nullptr) return false;
    if (!ExpectWord("so")) return false;
    if (!ExpectWord("that")) return false;
    s.expr = ParseAdditive();
    if (s.expr == nullptr) return false;
    if (!cur_.Is(TokKind::kOp, "=") && !cur_.Is(TokKind::kOp, "==")) {
      return Fail("'=' between the two sides of the condition");
    }
    Advance();
    s.expr2 = ParseAdditive();
    if (s.expr2 == nullptr) return false;
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParseUse(Stmt& s) {
    s.kind = StmtKind::kUse;
    Advance();
    if (!ExpectString(&s.text, &s.text_range, "a quoted template path")) return false;
    if (!ExpectWord("as")) return false;
    if (!ExpectName(&s.name, &s.name_range, "a prefix")) return false;
    if (AtWord("with")) {
      Advance();
      for (;;) {
        Binding b;
        if (!ExpectName(&b.name, &b.name_range, "a template input name")) return false;
        if (!ExpectOp("=")) return false;
        b.value = ParseExpr();
        if (b.value == nullptr) return false;
        s.bindings.push_back(b);
        if (!cur_.Is(TokKind::kOp, ",")) break;
        Advance();
      }
    }
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParseTable(Stmt& s) {
    s.kind = StmtKind::kTable;
    Advance();
    if (!ExpectName(&s.name, &s.name_range, "a table name")) return false;
    if (!ExpectOp("=")) return false;
    if (!ExpectString(&s.text, &s.text_range, "a quoted CSV path")) return false;
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParsePrefer(Stmt& s) {
    s.kind = StmtKind::kPrefer;
    // The lexer has not read past 'prefer': the units are read as runs.
    for (;;) {
      Token u = lex_.NextUnit();
      if (u.text.empty()) {
        Advance();
        return Fail("a unit");
      }
      s.units.push_back(UnitRef{u.text, u.range});
      Advance();
      if (!cur_.Is(TokKind::kOp, ",")) break;
    }
    return true;
  }

  // profile counter|parallel: hot T_h1 to T_h2, cold T_c1 to T_c2 ["caption"]
  bool ParseProfile(Stmt& s) {
    s.kind = StmtKind::kProfile;
    Advance();
    if (!AtWord("counter") && !AtWord("parallel")) return Fail("'counter' or 'parallel'");
    s.name = cur_.text;
    s.name_range = cur_.range;
    Advance();
    if (!ExpectOp(":")) return false;
    for (const char* side : {"hot", "cold"}) {
      if (!ExpectWord(side)) return false;
      for (int end = 0; end < 2; ++end) {
        if (end == 1 && !ExpectWord("to")) return false;
        if (cur_.kind != TokKind::kIdent || IsKeyword(cur_.text)) {
          return Fail(end == 0 ? "the inlet temperature's name" : "the outlet temperature's name");
        }
        Expr& e = deck_.NewExpr(ExprKind::kName, cur_.range);
        e.text = cur_.text;
        s.streams.push_back(&e);
        Advance();
      }
      if (side[0] == 'h' && !ExpectOp(",")) return false;
    }
    ParseAttrs(s.attrs);
    return true;
  }

  bool ParseCalc(Stmt& s) {
    s.kind = StmtKind::kCalc;
    if (!ExpectName(&s.name, &s.name_range, "a quantity name")) return false;
    if (!cur_.Is(TokKind::kOp, "=")) {
      diags_.Error(s.name_range,
                   fmt::format("unknown statement '{}': a calculated quantity is written "
                               "'{} = expression'",
                               s.name, s.name));
      SkipStatement();
      return false;
    }
    Advance();
    s.expr = ParseExpr();
    if (s.expr == nullptr) return false;
    if (AtWord("in")) {
      Token u = lex_.NextUnit();
      if (u.text.empty()) {
        Advance();
        return Fail("a display unit after 'in'");
      }
      s.display = UnitRef{u.text, u.range};
      Advance();
    }
    ParseAttrs(s.attrs);
    return true;
  }

  // ---- expressions -------------------------------------------------------

  struct DepthGuard {
    explicit DepthGuard(int& d) : depth(d) { ++depth; }
    ~DepthGuard() { --depth; }
    DepthGuard(const DepthGuard&) = delete;
    DepthGuard& operator=(const DepthGuard&) = delete;
    int& depth;
  };

  bool TooDeep() {
    if (depth_ <= limits_.max_depth) return false;
    diags_.Error(cur_.range,
                 fmt::format("expression nested too deeply (limit {} levels)", limits_.max_depth));
    SkipStatement();
    return true;
  }

  // Every later stage walks the tree recursively, so the tree's depth is
  // bounded too, not only the parser's own recursion: a sum of 10 000 terms
  // is as deep as 10 000 parentheses.
  const Expr* Binary(ExprKind k, const Expr* a, const Expr* b) {
    const int depth = 1 + std::max(Depth(*a), Depth(*b));
    if (depth > limits_.max_depth) {
      if (!too_deep_reported_) {
        diags_.Error(Span(a->range, b->range),
                     fmt::format("expression nested too deeply (limit {} levels); split it into "
                                 "named quantities",
                                 limits_.max_depth));
        too_deep_reported_ = true;
      }
      return nullptr;
    }
    Expr& e = deck_.NewExpr(k, Span(a->range, b->range));
    e.args = {a, b};
    SetDepth(e, depth);
    return &e;
  }

  int Depth(const Expr& e) const {
    const auto i = static_cast<size_t>(e.id);
    return i < depth_of_.size() ? depth_of_[i] : 1;
  }

  void SetDepth(const Expr& e, int depth) {
    if (depth_of_.size() <= static_cast<size_t>(e.id))
      depth_of_.resize(static_cast<size_t>(e.id) + 1, 0);
    depth_of_[static_cast<size_t>(e.id)] = depth;
  }

  const Expr* ParseExpr() {
    DepthGuard g(depth_);
    if (TooDeep()) return nullptr;
    const Expr* lhs = ParseAnd();
    while (lhs != nullptr && AtWord("or")) {
      Advance();
      const Expr* rhs = ParseAnd();
      if (rhs == nullptr) return nullptr;
      lhs = Binary(ExprKind::kOr, lhs, rhs);
    }
    return lhs;
  }

  const Expr* ParseAnd() {
    const Expr* lhs = ParseNot();
    while (lhs != nullptr && AtWord("and")) {
      Advance();
      const Expr* rhs = ParseNot();
      if (rhs == nullptr) return nullptr;
      lhs = Binary(ExprKind::kAnd, lhs, rhs);
    }
    return lhs;
  }

  const Expr* ParseNot() {
    if (AtWord("not")) {
      DepthGuard g(depth_);
      if (TooDeep()) return nullptr;
      const SourceRange r = cur_.range;
      Advance();
      const Expr* operand = ParseNot();
      if (operand == nullptr) return nullptr;
      Expr& e = deck_.NewExpr(ExprKind::kNot, Span(r, operand->range));
      e.args.push_back(operand);
      return &e;
    }
    return ParseComparison();
  }

  const Expr* ParseComparison() {
    const Expr* lhs = ParseAdditive();
    if (lhs == nullptr) return nullptr;
    ExprKind k;
    if (!ComparisonAt(&k)) return lhs;
    Advance();
    const Expr* rhs = ParseAdditive();
    if (rhs == nullptr) return nullptr;
    ExprKind k2;
    if (ComparisonAt(&k2)) {
      diags_.Error(cur_.range, "comparisons do not chain; write 'a < b and b < c'");
      SkipStatement();
      return nullptr;
    }
    return Binary(k, lhs, rhs);
  }

  bool ComparisonAt(ExprKind* k) const {
    if (cur_.kind != TokKind::kOp) return false;
    if (cur_.text == "<")
      *k = ExprKind::kLt;
    else if (cur_.text == "<=")
      *k = ExprKind::kLe;
    else if (cur_.text == ">")
      *k = ExprKind::kGt;
    else if (cur_.text == ">=")
      *k = ExprKind::kGe;
    else if (cur_.text == "==")
      *k = ExprKind::kEq;
    else if (cur_.text == "!=")
      *k = ExprKind::kNe;
    else
      return false;
    return true;
  }

  const Expr* ParseAdditive() {
    const Expr* lhs = ParseMultiplicative();
    while (lhs != nullptr && (cur_.Is(TokKind::kOp, "+") || cur_.Is(TokKind::kOp, "-"))) {
      const ExprKind k = cur_.text == "+" ? ExprKind::kAdd : ExprKind::kSub;
      Advance();
      const Expr* rhs = ParseMultiplicative();
      if (rhs == nullptr) return nullptr;
      lhs = Binary(k, lhs, rhs);
    }
    return lhs;
  }

  const Expr* ParseMultiplicative() {
    const Expr* lhs = ParseUnary();
    while (lhs != nullptr && (cur_.Is(TokKind::kOp, "*") || cur_.Is(TokKind::kOp, "/"))) {
      const ExprKind k = cur_.text == "*" ? ExprKind::kMul : ExprKind::kDiv;
      Advance();
      const Expr* rhs = ParseUnary();
      if (rhs == nullptr) return nullptr;
      lhs = Binary(k, lhs, rhs);
    }
    return lhs;
  }

  const Expr* ParseUnary() {
    DepthGuard g(depth_);
    if (TooDeep()) return nullptr;
    if (cur_.Is(TokKind::kOp, "-") || cur_.Is(TokKind::kOp, "+")) {
      const bool neg = cur_.text == "-";
      const SourceRange r = cur_.range;
      Advance();
      const Expr* operand = ParseUnary();
      if (operand == nullptr) return nullptr;
      if (!neg) return operand;
      Expr& e = deck_.NewExpr(ExprKind::kNeg, Span(r, operand->range));
      e.args.push_back(operand);
      return &e;
    }
    return ParsePower();
  }

  // Power binds tighter than unary minus on its left (-x^2 is -(x^2)) and is
  // right-associative; its exponent may carry a sign (x^-2).
  const Expr* ParsePower() {
    const Expr* base = ParsePrimary();
    if (base == nullptr) return nullptr;
    if (!cur_.Is(TokKind::kOp, "^")) return base;
    Advance();
    const Expr* exponent = ParseUnary();
    if (exponent == nullptr) return nullptr;
    return Binary(ExprKind::kPow, base, exponent);
  }

  const Expr* ParsePrimary() {
    if (cur_.kind == TokKind::kNumber) return MakeNumber();
    if (cur_.kind == TokKind::kIdent) {
      if (IsKeyword(cur_.text) && cur_.text != "if") {
        diags_.Error(cur_.range, fmt::format("expected a value, found keyword '{}'", cur_.text));
        SkipStatement();
        return nullptr;
      }
      const Token name = cur_;
      Advance();
      if (!cur_.Is(TokKind::kOp, "(")) {
        if (name.text == "if") {
          diags_.Error(name.range, "'if' is written if(condition, value, otherwise)");
          SkipStatement();
          return nullptr;
        }
        Expr& e = deck_.NewExpr(ExprKind::kName, name.range);
        e.text = name.text;
        return &e;
      }
      Advance();  // (
      Expr& call = deck_.NewExpr(ExprKind::kCall, name.range);
      call.text = name.text;
      if (!cur_.Is(TokKind::kOp, ")")) {
        for (;;) {
          const Expr* a = ParseExpr();
          if (a == nullptr) return nullptr;
          call.args.push_back(a);
          if (!cur_.Is(TokKind::kOp, ",")) break;
          Advance();
        }
      }
      if (!cur_.Is(TokKind::kOp, ")")) {
        Fail(fmt::format("',' or ')' in the call of {}", name.text));
        return nullptr;
      }
      call.range = Span(name.range, cur_.range);
      Advance();
      return &call;
    }
    if (cur_.Is(TokKind::kOp, "(")) {
      const SourceRange open = cur_.range;
      Advance();
      const Expr* inner = ParseExpr();
      if (inner == nullptr) return nullptr;
      if (!cur_.Is(TokKind::kOp, ")")) {
        diags_.Error(cur_.range, fmt::format("expected ')' to close the '(' at column {}, "
                                             "found {}",
                                             open.col, Describe(cur_)));
        SkipStatement();
        return nullptr;
      }
      // Parentheses leave no node; the flag keeps them for display.
      Expr& e = deck_.exprs[static_cast<size_t>(inner->id)];
      e.parenthesized = true;
      e.range = Span(open, cur_.range);
      Advance();
      return inner;
    }
    if (cur_.Is(TokKind::kOp, "=")) {
      diags_.Error(cur_.range, "unexpected '='; compare with ==");
      SkipStatement();
      return nullptr;
    }
    Fail("a value");
    return nullptr;
  }

  Lexer lex_;
  Diagnostics& diags_;
  const ParseLimits& limits_;
  Deck deck_;
  Token cur_;
  Token prev_;  // the token before cur_, for hints
  int depth_ = 0;
  std::vector<int> depth_of_;  // tree depth per expression id
  bool too_deep_reported_ = false;
};

}  // namespace

Deck Parse(std::string_view file, std::string_view source, Diagnostics& diags,
           const ParseLimits& limits) {
  Parser p(file, source, diags, limits);
  return p.Run();
}

}  // namespace heatdeck
