#include "lang/parser.h"

#include <gtest/gtest.h>

namespace heatdeck {
namespace {

struct Parsed {
  SourceFiles files;
  Diagnostics diags;
  Deck deck;
};

// Parses text as file "input" and returns the dump plus the diagnostics.
std::string DumpOf(const std::string& text, std::string* errors = nullptr) {
  SourceFiles files;
  Diagnostics diags;
  const std::string_view name = files.Add("input", text);
  Deck deck = Parse(name, files.Text(name), diags);
  if (errors != nullptr) {
    errors->clear();
    for (const Diagnostic* d : diags.Sorted()) *errors += Render(*d, files, false);
  }
  return Dump(deck);
}

struct Case {
  const char* text;
  const char* dump;
};

TEST(Parser, Statements) {
  const Case cases[] = {
      {"title \"Cooler\"", "1:title \"Cooler\"\n"},
      {"meta number \"TC-1\"", "1:meta number \"TC-1\"\n"},
      {"section \"Data\"\n> Both streams.", "1:section \"Data\"\n2:> \"Both streams.\"\n"},
      {"given m_h = 0.50 kg/s \"Hot flow\" source \"Balance\"",
       "1:given m_h = 0.50[kg/s] \"Hot flow\" source \"Balance\"\n"},
      {"given cp = 4.19 kJ/(kg*K)", "1:given cp = 4.19[kJ/(kg*K)]\n"},
      {"given T = -5 degC", "1:given T = (-5[degC])\n"},
      {"given k = 5 1/m", "1:given k = 5[1/m]\n"},
      {"given x = 25mm", "1:given x = 25[mm]\n"},
      {"given e = 5 %", "1:given e = 5[%]\n"},
      {"given T = 20 \xC2\xB0"
       "C",
       "1:given T = 20[\xC2\xB0"
       "C]\n"},
      {"Q = eps * C_min * (T_h1 - T_c1) in kW \"Duty\"",
       "1:calc Q = ((eps * C_min) * (T_h1 - T_c1)) in kW \"Duty\"\n"},
      {"D = 2 in in mm", "1:calc D = 2[in] in mm\n"},
      {"U = 1 / R in W/(m^2*K)", "1:calc U = (1 / R) in W/(m^2*K)\n"},
      {"y = -x^2", "1:calc y = (-(x ^ 2))\n"},
      {"y = x^-2", "1:calc y = (x ^ (-2))\n"},
      {"y = a^b^c", "1:calc y = (a ^ (b ^ c))\n"},
      {"y = a - b - c", "1:calc y = ((a - b) - c)\n"},
      {"y = min(a, 3 W/K)", "1:calc y = min(a, 3[W/K])\n"},
      {"y = (T - 20 degC)", "1:calc y = (T - 20[degC])\n"},
      {"y = if(a > 2, b, c)", "1:calc y = if((a > 2), b, c)\n"},
      {"y = hx.Q + oil.cp(T)", "1:calc y = (hx.Q + oil.cp(T))\n"},
      {"check T_h2 <= 45 degC \"Limit\"", "1:check (T_h2 <= 45[degC]) \"Limit\"\n"},
      {"check a > 1 and not b < 2 or c == 3",
       "1:check (((a > 1) and (not (b < 2))) or (c == 3))\n"},
      {"case fouled \"Fouled\": Rf = 0.0004 m^2*K/W, m = 2 kg/s",
       "1:case fouled: Rf = 0.0004[m^2*K/W], m = 2[kg/s] \"Fouled\"\n"},
      {"sweep m from 0.2 kg/s to 1 kg/s step 0.1 kg/s",
       "1:sweep m from 0.2[kg/s] to 1[kg/s] step 0.1[kg/s]\n"},
      {"sweep n from 0 to 10 step 1", "1:sweep n from 0 to 10 step 1\n"},
      {"sweep m over 1 kg/s, 2 kg/s", "1:sweep m over 1[kg/s], 2[kg/s]\n"},
      {"solve L from 1 m to 20 m so that Q = 30 kW",
       "1:solve L from 1[m] to 20[m] so that Q = 30[kW]\n"},
      {"use \"stdlib/double_pipe.deck\" as hx with m_h = m_oil, T_h1 = T_in + 5 K",
       "1:use \"stdlib/double_pipe.deck\" as hx with m_h = m_oil, T_h1 = (T_in + 5[K])\n"},
      {"table oil = \"oil.csv\" source \"Supplier\"",
       "1:table oil = \"oil.csv\" source \"Supplier\"\n"},
      {"prefer kW, degC, W/(m^2*K)", "1:prefer kW, degC, W/(m^2*K)\n"},
      {"y = f(a,\n      b)\nz = 1", "1:calc y = f(a, b)\n3:calc z = 1\n"},
      {"y = a + \\\n    b", "1:calc y = (a + b)\n"},
      {"# comment\ny = 1 # trailing", "2:calc y = 1\n"},
      {"\xEF\xBB\xBFy = 1\r\nz = 2\r\n", "1:calc y = 1\n2:calc z = 2\n"},
      {"s = \"a \\\"q\\\" b\"", ""},
  };
  for (const auto& c : cases) {
    std::string errors;
    const std::string dump = DumpOf(c.text, &errors);
    if (std::string(c.dump).empty()) {
      EXPECT_FALSE(errors.empty()) << c.text;
      continue;
    }
    EXPECT_EQ(errors, "") << c.text;
    EXPECT_EQ(dump, c.dump) << c.text;
  }
}

TEST(Parser, ErrorsAreLocatedAndRecoveryContinues) {
  std::string errors;
  const std::string dump = DumpOf(
      "given m = 2 x\n"
      "y = (a + b\n"
      "z = 3\n"
      "check q = 2\n"
      "given w = a * 2\n"
      "frobnicate 5\n",
      &errors);
  EXPECT_EQ(dump, "1:given m = 2[x]\n3:calc z = 3\n");
  EXPECT_EQ(errors,
            "input:2:11: error: expected ')' to close the '(' at column 5, found end of line\n"
            "  y = (a + b\n"
            "            ^\n"
            "input:4:9: error: a check compares with ==, not =\n"
            "  check q = 2\n"
            "          ^\n"
            "input:5:11: error: expected a literal value such as 0.5 kg/s: this takes a number "
            "with its unit, not an expression (write a calculated quantity instead)\n"
            "  given w = a * 2\n"
            "            ^\n"
            "input:6:1: error: unknown statement 'frobnicate': a calculated quantity is written "
            "'frobnicate = expression'\n"
            "  frobnicate 5\n"
            "  ^~~~~~~~~~\n");
}

TEST(Parser, DeepNestingIsAnErrorNotACrash) {
  std::string errors;
  const std::string text = "y = " + std::string(10000, '(') + "1" + std::string(10000, ')');
  DumpOf(text, &errors);
  EXPECT_NE(errors.find("nested too deeply"), std::string::npos);
}

TEST(Parser, UnterminatedStringAndBadUtf8) {
  std::string errors;
  DumpOf("title \"abc\n", &errors);
  EXPECT_NE(errors.find("input:1:7: error: unterminated string"), std::string::npos) << errors;
  DumpOf("title \"a\xFF\"\n", &errors);
  EXPECT_NE(errors.find("input:1:9: error: invalid UTF-8 byte 0xFF"), std::string::npos) << errors;
}

// A '\' at the very end of a file without a last newline continues onto no
// line: the error is on the line of the '\', not on a line 3 that the file
// does not have.
TEST(Parser, ContinuationAtTheEndOfTheFileStaysOnItsLine) {
  std::string errors;
  DumpOf("given a = 1 m\nx = a + \\", &errors);
  EXPECT_NE(errors.find("input:2:10: error: expected a value, found end of line"),
            std::string::npos)
      << errors;
  EXPECT_EQ(errors.find("input:3:"), std::string::npos) << errors;
}

// Found by fuzz_deck: a broken UTF-8 lead byte just before a newline took
// the newline into its "character", so every later line was counted as
// line 1 and carets pointed past the end of the quoted line.
TEST(Parser, BrokenUtf8LeadByteKeepsTheLineCount) {
  std::string errors;
  DumpOf("x = 1 \xE8\ny = 2 $\n", &errors);
  EXPECT_NE(errors.find("input:2:7: error: unexpected character '$'"), std::string::npos) << errors;
}

// Found by fuzz_deck: a column past the end of a line longer than the
// 200-byte quote window threw std::out_of_range from the renderer.
TEST(Parser, CaretPastTheEndOfALongLine) {
  SourceFiles files;
  const std::string_view name = files.Add("input", std::string(250, 'a') + "\n");
  Diagnostic d;
  d.severity = Severity::kError;
  d.range = SourceRange{name, 1, 340, 340};
  d.message = "somewhere";
  const std::string text = Render(d, files, false);
  EXPECT_NE(text.find("input:1:340: error: somewhere\n  " + std::string(200, 'a') + "\n"),
            std::string::npos)
      << text;
}

// A deck must not be able to drive the terminal that shows its errors.
TEST(Parser, QuotedLineShowsControlBytesAsQuestionMarks) {
  std::string errors;
  DumpOf("title \"\x1b[2J\x1b]0;x\x07\" $\n", &errors);
  EXPECT_EQ(errors.find('\x1b'), std::string::npos) << errors;
  EXPECT_EQ(errors.find('\x07'), std::string::npos) << errors;
  EXPECT_NE(errors.find("  title \"?[2J?]0;x?\" $\n"), std::string::npos) << errors;
}

TEST(Parser, HugeNumberIsAnError) {
  std::string errors;
  DumpOf("given x = 1e400 m", &errors);
  EXPECT_NE(errors.find("too large"), std::string::npos) << errors;
}

}  // namespace
}  // namespace heatdeck
