// The muParser dialect heatdeck compiles to.  Derived from mu::ParserBase
// rather than mu::Parser for two measured reasons: mu::Parser's constructor
// defines some thirty functions and operators per instance (about 55 µs,
// which a 100 000-statement deck pays 100 000 times), and its default number
// recogniser builds a std::stringstream over the rest of the expression at
// every token (quadratic in the expression's length).  Here only the
// functions the translator emits are defined, and numbers are read with
// std::strtod in place.
#pragma once

#include <muParserBase.h>

namespace heatdeck {

class ExprParser : public mu::ParserBase {
 public:
  ExprParser();

 protected:
  void InitCharSets() override;
  void InitFun() override;
  void InitConst() override;
  void InitOprt() override;

 private:
  static int ReadNumber(const char* expr, int* pos, double* value);
};

}  // namespace heatdeck
