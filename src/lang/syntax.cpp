#include "lang/syntax.h"

#include <fmt/format.h>

namespace heatdeck {

const char* OperatorText(ExprKind k) {
  switch (k) {
    case ExprKind::kNeg:
    case ExprKind::kSub:
      return "-";
    case ExprKind::kAdd:
      return "+";
    case ExprKind::kMul:
      return "*";
    case ExprKind::kDiv:
      return "/";
    case ExprKind::kPow:
      return "^";
    case ExprKind::kLt:
      return "<";
    case ExprKind::kLe:
      return "<=";
    case ExprKind::kGt:
      return ">";
    case ExprKind::kGe:
      return ">=";
    case ExprKind::kEq:
      return "==";
    case ExprKind::kNe:
      return "!=";
    case ExprKind::kAnd:
      return "and";
    case ExprKind::kOr:
      return "or";
    case ExprKind::kNot:
      return "not";
    case ExprKind::kNumber:
    case ExprKind::kName:
    case ExprKind::kCall:
      return "";
  }
  return "";
}

bool IsComparison(ExprKind k) {
  return k == ExprKind::kLt || k == ExprKind::kLe || k == ExprKind::kGt || k == ExprKind::kGe ||
         k == ExprKind::kEq || k == ExprKind::kNe;
}

bool IsLogical(ExprKind k) {
  return k == ExprKind::kAnd || k == ExprKind::kOr || k == ExprKind::kNot;
}

const char* StmtKeyword(StmtKind k) {
  switch (k) {
    case StmtKind::kTitle:
      return "title";
    case StmtKind::kMeta:
      return "meta";
    case StmtKind::kSection:
      return "section";
    case StmtKind::kNarrative:
      return ">";
    case StmtKind::kGiven:
      return "given";
    case StmtKind::kCalc:
      return "calc";
    case StmtKind::kCheck:
      return "check";
    case StmtKind::kCase:
      return "case";
    case StmtKind::kSweep:
      return "sweep";
    case StmtKind::kSolve:
      return "solve";
    case StmtKind::kUse:
      return "use";
    case StmtKind::kTable:
      return "table";
    case StmtKind::kPrefer:
      return "prefer";
    case StmtKind::kProfile:
      return "profile";
  }
  return "?";
}

std::string DumpExpr(const Expr& e) {
  switch (e.kind) {
    case ExprKind::kNumber:
      return e.unit.empty() ? std::string(e.text) : fmt::format("{}[{}]", e.text, e.unit);
    case ExprKind::kName:
      return std::string(e.text);
    case ExprKind::kCall: {
      std::string s = fmt::format("{}(", e.text);
      for (size_t i = 0; i < e.args.size(); ++i) {
        if (i > 0) s += ", ";
        s += DumpExpr(*e.args[i]);
      }
      return s + ")";
    }
    case ExprKind::kNeg:
      return fmt::format("(-{})", DumpExpr(*e.args[0]));
    case ExprKind::kNot:
      return fmt::format("(not {})", DumpExpr(*e.args[0]));
    default:
      return fmt::format("({} {} {})", DumpExpr(*e.args[0]), OperatorText(e.kind),
                         DumpExpr(*e.args[1]));
  }
}

namespace {

std::string Quote(const std::string& s) { return fmt::format("\"{}\"", s); }

std::string DumpAttrs(const Attrs& a) {
  std::string s;
  if (a.description_range.valid()) s += " " + Quote(a.description);
  if (a.source_range.valid()) s += " source " + Quote(a.source);
  return s;
}

std::string DumpBindings(const std::vector<Binding>& bs) {
  std::string s;
  for (size_t i = 0; i < bs.size(); ++i) {
    if (i > 0) s += ", ";
    s += fmt::format("{} = {}", bs[i].name, DumpExpr(*bs[i].value));
  }
  return s;
}

}  // namespace

std::string Dump(const Deck& deck) {
  std::string out;
  for (const Stmt& s : deck.stmts) {
    out += fmt::format("{}:{} ", s.range.line, StmtKeyword(s.kind));
    switch (s.kind) {
      case StmtKind::kTitle:
      case StmtKind::kSection:
      case StmtKind::kNarrative:
        out += Quote(s.text);
        break;
      case StmtKind::kMeta:
        out += fmt::format("{} {}", s.name, Quote(s.text));
        break;
      case StmtKind::kGiven:
      case StmtKind::kCalc:
        out += fmt::format("{} = {}", s.name, DumpExpr(*s.expr));
        if (!s.display.text.empty()) out += fmt::format(" in {}", s.display.text);
        break;
      case StmtKind::kCheck:
        out += DumpExpr(*s.expr);
        break;
      case StmtKind::kCase:
        out += fmt::format("{}: {}", s.name, DumpBindings(s.bindings));
        break;
      case StmtKind::kSweep:
        out += std::string(s.name);
        if (s.step != nullptr) {
          out += fmt::format(" from {} to {} step {}", DumpExpr(*s.from), DumpExpr(*s.to),
                             DumpExpr(*s.step));
        } else {
          out += " over";
          for (size_t i = 0; i < s.over.size(); ++i) {
            out += (i == 0 ? " " : ", ") + DumpExpr(*s.over[i]);
          }
        }
        break;
      case StmtKind::kSolve:
        out += fmt::format("{} from {} to {} so that {} = {}", s.name, DumpExpr(*s.from),
                           DumpExpr(*s.to), DumpExpr(*s.expr), DumpExpr(*s.expr2));
        break;
      case StmtKind::kUse:
        out += fmt::format("{} as {}", Quote(s.text), s.name);
        if (!s.bindings.empty()) out += " with " + DumpBindings(s.bindings);
        break;
      case StmtKind::kTable:
        out += fmt::format("{} = {}", s.name, Quote(s.text));
        break;
      case StmtKind::kPrefer:
        for (size_t i = 0; i < s.units.size(); ++i) {
          out += (i == 0 ? "" : ", ") + std::string(s.units[i].text);
        }
        break;
      case StmtKind::kProfile:
        out +=
            fmt::format("{}: hot {} to {}, cold {} to {}", s.name, DumpExpr(*s.streams[0]),
                        DumpExpr(*s.streams[1]), DumpExpr(*s.streams[2]), DumpExpr(*s.streams[3]));
        break;
    }
    out += DumpAttrs(s.attrs);
    out += '\n';
  }
  return out;
}

}  // namespace heatdeck

namespace heatdeck {

int Precedence(ExprKind k) {
  switch (k) {
    case ExprKind::kOr:
      return 1;
    case ExprKind::kAnd:
      return 2;
    case ExprKind::kNot:
      return 3;
    case ExprKind::kLt:
    case ExprKind::kLe:
    case ExprKind::kGt:
    case ExprKind::kGe:
    case ExprKind::kEq:
    case ExprKind::kNe:
      return 4;
    case ExprKind::kAdd:
    case ExprKind::kSub:
      return 5;
    case ExprKind::kMul:
    case ExprKind::kDiv:
      return 6;
    case ExprKind::kNeg:
      return 7;
    case ExprKind::kPow:
      return 8;
    default:
      return 9;
  }
}

std::string Pretty(const Expr& e, const std::function<std::string(const Expr&)>& leaf) {
  if (leaf) {
    std::string s = leaf(e);
    if (!s.empty()) return s;
  }
  auto child = [&](const Expr& c, bool right) {
    std::string s = Pretty(c, leaf);
    const int pc = Precedence(c.kind), pe = Precedence(e.kind);
    bool wrap = c.parenthesized && pc < 9;
    if (pc < pe) wrap = true;
    if (pc == pe && right && e.kind != ExprKind::kPow && e.kind != ExprKind::kAdd &&
        e.kind != ExprKind::kMul) {
      wrap = true;
    }
    if (pc == pe && !right && e.kind == ExprKind::kPow) wrap = true;
    return wrap ? "(" + s + ")" : s;
  };
  switch (e.kind) {
    case ExprKind::kNumber:
      return e.unit.empty() ? std::string(e.text) : fmt::format("{} {}", e.text, e.unit);
    case ExprKind::kName:
      return std::string(e.text);
    case ExprKind::kCall: {
      std::string s = fmt::format("{}(", e.text);
      for (size_t i = 0; i < e.args.size(); ++i) {
        if (i > 0) s += ", ";
        s += Pretty(*e.args[i], leaf);
      }
      return s + ")";
    }
    case ExprKind::kNeg:
      return "-" + child(*e.args[0], true);
    case ExprKind::kNot:
      return "not " + child(*e.args[0], true);
    case ExprKind::kPow:
      return child(*e.args[0], false) + "^" + child(*e.args[1], true);
    default:
      return fmt::format("{} {} {}", child(*e.args[0], false), OperatorText(e.kind),
                         child(*e.args[1], true));
  }
}

}  // namespace heatdeck
