#include <cmath>
#include <random>
#include <string>
#include <string_view>

#include <gtest/gtest.h>

#include "units/unit.h"

namespace heatdeck::units {
namespace {

Unit Parse(std::string_view text) {
  Unit u;
  UnitError error;
  EXPECT_TRUE(ParseUnit(text, &u, &error)) << text << ": " << error.message;
  return u;
}

UnitError ParseError(std::string_view text) {
  Unit u;
  UnitError error;
  EXPECT_FALSE(ParseUnit(text, &u, &error)) << text << " parsed as " << u.text;
  return error;
}

// --- Temperatures (LANGUAGE.md "Temperatures") -------------------------
// Celsius and Fahrenheit scale definitions: T[K] = t[degC] + 273.15,
// T[K] = (t[degF] + 459.67) * 5/9 (NIST SP 811, from memory).

TEST(UnitParserTest, BareDegCIsAbsolute) {
  const Unit u = Parse("degC");
  EXPECT_EQ(u.dim, dim::kTemperature);
  EXPECT_EQ(u.kind, TempKind::kAbsolute);
  EXPECT_EQ(u.factor, 1.0);
  EXPECT_EQ(u.offset, 273.15);
  EXPECT_DOUBLE_EQ(u.ToSi(20), 293.15);
  EXPECT_DOUBLE_EQ(u.FromSi(373.15), 100);
}

TEST(UnitParserTest, BareDegFIsAbsolute) {
  const Unit u = Parse("degF");
  EXPECT_EQ(u.kind, TempKind::kAbsolute);
  EXPECT_DOUBLE_EQ(u.factor, 5.0 / 9.0);
  EXPECT_DOUBLE_EQ(u.ToSi(32), 273.15);
  EXPECT_DOUBLE_EQ(u.ToSi(-459.67), 0.0);
}

TEST(UnitParserTest, ParenthesesAroundBareScaleKeepItAbsolute) {
  const Unit u = Parse("(degC)");
  EXPECT_EQ(u.kind, TempKind::kAbsolute);
  EXPECT_EQ(u.offset, 273.15);
}

TEST(UnitParserTest, DegCInsideCompoundIsInterval) {
  const Unit u = Parse("W/(m^2*degC)");
  EXPECT_EQ(u.dim, dim::kHeatTransferCoeff);
  EXPECT_EQ(u.factor, 1.0);
  EXPECT_EQ(u.offset, 0.0);
  EXPECT_EQ(u.kind, TempKind::kNone);
}

TEST(UnitParserTest, DegFInsideCompoundIsIntervalOfFiveNinths) {
  // 1 Btu/(lbm*degF) = 1055.05585262 J / (0.45359237 kg * 5/9 K) = 4186.8 J/(kg*K).
  const Unit u = Parse("Btu/(lbm*degF)");
  EXPECT_EQ(u.dim, dim::kSpecificHeat);
  EXPECT_EQ(u.offset, 0.0);
  EXPECT_NEAR(u.factor, 4186.8, 4186.8 * 1e-12);
  // A compound that reduces to a temperature is an interval.
  const Unit t = Parse("degF*m/m");
  EXPECT_EQ(t.dim, dim::kTemperature);
  EXPECT_EQ(t.kind, TempKind::kInterval);
  EXPECT_DOUBLE_EQ(t.factor, 5.0 / 9.0);
  EXPECT_EQ(t.offset, 0.0);
}

TEST(UnitParserTest, PowersAndInversesOfScaleAreIntervals) {
  const Unit sq = Parse("degC^2");
  EXPECT_EQ(sq.dim, dim::kTemperature.Pow(2));
  EXPECT_EQ(sq.offset, 0.0);
  EXPECT_EQ(sq.kind, TempKind::kNone);
  const Unit inv = Parse("1/degF");
  EXPECT_EQ(inv.dim, dim::kOne / dim::kTemperature);
  EXPECT_DOUBLE_EQ(inv.factor, 9.0 / 5.0);
  EXPECT_EQ(inv.offset, 0.0);
  // An exponent, even 1, makes a compound.
  EXPECT_EQ(Parse("degC^1").kind, TempKind::kInterval);
}

TEST(UnitParserTest, IntervalSymbols) {
  const Unit c = Parse("ddegC");
  EXPECT_EQ(c.kind, TempKind::kInterval);
  EXPECT_EQ(c.factor, 1.0);
  EXPECT_EQ(c.offset, 0.0);
  const Unit f = Parse("ddegF");
  EXPECT_EQ(f.kind, TempKind::kInterval);
  EXPECT_DOUBLE_EQ(f.factor, 5.0 / 9.0);
  EXPECT_EQ(f.offset, 0.0);
}

TEST(UnitParserTest, KelvinAndRankineAreEither) {
  const Unit k = Parse("K");
  EXPECT_EQ(k.kind, TempKind::kEither);
  EXPECT_EQ(k.factor, 1.0);
  EXPECT_EQ(k.offset, 0.0);
  const Unit r = Parse("R");
  EXPECT_EQ(r.kind, TempKind::kEither);
  EXPECT_DOUBLE_EQ(r.factor, 5.0 / 9.0);
  EXPECT_EQ(r.offset, 0.0);
  const Unit mk = Parse("mK");
  EXPECT_EQ(mk.kind, TempKind::kEither);
  EXPECT_DOUBLE_EQ(mk.factor, 1e-3);
  // Built from kelvin alone, a compound temperature stays "either".
  EXPECT_EQ(Parse("W/(W/K)").kind, TempKind::kEither);
  // Not a temperature at all.
  EXPECT_EQ(Parse("W/K").kind, TempKind::kNone);
}

// --- Prefixes ------------------------------------------------------------

TEST(UnitParserTest, SiPrefixes) {
  EXPECT_DOUBLE_EQ(Parse("kW").factor, 1e3);
  EXPECT_EQ(Parse("kW").dim, dim::kPower);
  EXPECT_DOUBLE_EQ(Parse("MPa").factor, 1e6);
  EXPECT_DOUBLE_EQ(Parse("mm").factor, 1e-3);
  EXPECT_DOUBLE_EQ(Parse("um").factor, 1e-6);
  EXPECT_DOUBLE_EQ(Parse("ms").factor, 1e-3);
  EXPECT_DOUBLE_EQ(Parse("mg").factor, 1e-6);
  EXPECT_DOUBLE_EQ(Parse("mbar").factor, 100);
  EXPECT_DOUBLE_EQ(Parse("mL").factor, 1e-6);
  EXPECT_DOUBLE_EQ(Parse("kmol").factor, 1e3);
  EXPECT_DOUBLE_EQ(Parse("MHz").factor, 1e6);
  EXPECT_DOUBLE_EQ(Parse("GJ").factor, 1e9);
  EXPECT_DOUBLE_EQ(Parse("dam").factor, 10);  // deca, the only two-letter prefix
  EXPECT_DOUBLE_EQ(Parse("dm").factor, 0.1);
  EXPECT_DOUBLE_EQ(Parse("hPa").factor, 100);
  EXPECT_DOUBLE_EQ(Parse("PW").factor, 1e15);
  EXPECT_DOUBLE_EQ(Parse("ym").factor, 1e-24);
  EXPECT_DOUBLE_EQ(Parse("YW").factor, 1e24);
  EXPECT_DOUBLE_EQ(Parse("mrad").factor, 1e-3);
  const Unit cp = Parse("kJ/(kg*K)");
  EXPECT_EQ(cp.dim, dim::kSpecificHeat);
  EXPECT_DOUBLE_EQ(cp.factor, 1e3);
  EXPECT_EQ(cp.kind, TempKind::kNone);
}

TEST(UnitParserTest, ExactSymbolWinsOverPrefixedReading) {
  EXPECT_EQ(Parse("min").factor, 60);  // not milli-inch
  EXPECT_EQ(Parse("min").dim, dim::kTime);
  EXPECT_EQ(Parse("Pa").dim, dim::kPressure);    // not peta-anything
  EXPECT_DOUBLE_EQ(Parse("ft").factor, 0.3048);  // not femto-tonne
  EXPECT_EQ(Parse("kg").factor, 1.0);
  EXPECT_DOUBLE_EQ(Parse("kcal").factor, 4186.8);  // IT kcal, its own entry
  EXPECT_DOUBLE_EQ(Parse("cP").factor, 1e-3);
  EXPECT_DOUBLE_EQ(Parse("P").factor, 0.1);  // poise, not a bare prefix
  EXPECT_EQ(Parse("yd").dim, dim::kLength);
  EXPECT_EQ(Parse("mi").dim, dim::kLength);
  EXPECT_EQ(Parse("d").factor, 86400);
  EXPECT_EQ(Parse("h").factor, 3600);
}

TEST(UnitParserTest, NoPrefixesOnNonSiUnits) {
  EXPECT_EQ(ParseError("kft").message, "unknown unit 'kft' ('ft' takes no SI prefix)");
  EXPECT_EQ(ParseError("kBtu").message, "unknown unit 'kBtu' ('Btu' takes no SI prefix)");
  EXPECT_EQ(ParseError("mdegC").message, "unknown unit 'mdegC' ('degC' takes no SI prefix)");
  EXPECT_EQ(ParseError("kkg").message, "unknown unit 'kkg' ('kg' takes no SI prefix)");
  EXPECT_EQ(ParseError("kh").message, "unknown unit 'kh' ('h' takes no SI prefix)");
}

// --- Syntax --------------------------------------------------------------

TEST(UnitParserTest, CompoundFactors) {
  // 1 lbm/h = 0.45359237 kg / 3600 s.
  EXPECT_DOUBLE_EQ(Parse("lbm/h").factor, 0.45359237 / 3600);
  // Left association: J/kg*K is (J/kg)*K.
  EXPECT_EQ(Parse("J/kg*K").dim, dim::kEnergy / dim::kMass * dim::kTemperature);
  EXPECT_EQ(Parse("m^2*K/W").dim, dim::kFoulingResistance);
  EXPECT_EQ(Parse("1/m").dim, dim::kPerLength);
  EXPECT_EQ(Parse("1/(m*K)").dim, dim::kOne / (dim::kLength * dim::kTemperature));
  EXPECT_EQ(Parse("m^-1").dim, dim::kPerLength);
  EXPECT_EQ(Parse("m^(-1)").dim, dim::kPerLength);
  EXPECT_EQ(Parse("(m/s)^2").dim, dim::kVelocity.Pow(2));
  EXPECT_DOUBLE_EQ(Parse("ft^3").factor, 0.3048 * 0.3048 * 0.3048);
  EXPECT_DOUBLE_EQ(Parse("%").factor, 0.01);
  EXPECT_EQ(Parse("%").dim, dim::kOne);
  EXPECT_EQ(Parse("m^0").dim, dim::kOne);
  EXPECT_EQ(Parse(" kg / s ").dim, dim::kMassFlow);
}

TEST(UnitParserTest, CanonicalText) {
  EXPECT_EQ(Parse("kJ/(kg*K)").text, "kJ/(kg*K)");
  EXPECT_EQ(Parse(" kg / s ").text, "kg/s");
  EXPECT_EQ(Parse("m^(-1)").text, "m^-1");
  EXPECT_EQ(Parse("um").text, "um");
}

TEST(UnitParserTest, UnicodeSpellings) {
  const Unit c = Parse(
      "\xC2\xB0"
      "C");  // °C
  EXPECT_EQ(c.text, "degC");
  EXPECT_EQ(c.kind, TempKind::kAbsolute);
  EXPECT_EQ(c.offset, 273.15);
  const Unit f = Parse(
      "\xC2\xB0"
      "F");  // °F
  EXPECT_EQ(f.text, "degF");
  EXPECT_EQ(f.kind, TempKind::kAbsolute);
  const Unit dc = Parse(
      "\xCE\x94\xC2\xB0"
      "C");  // Δ°C
  EXPECT_EQ(dc.text, "ddegC");
  EXPECT_EQ(dc.kind, TempKind::kInterval);
  const Unit df = Parse(
      "\xCE\x94\xC2\xB0"
      "F");  // Δ°F
  EXPECT_EQ(df.text, "ddegF");
  EXPECT_DOUBLE_EQ(df.factor, 5.0 / 9.0);
  EXPECT_EQ(Parse("\xE2\x84\x83").text, "degC");  // ℃

  const Unit micro_sign = Parse("\xC2\xB5m");  // µm, U+00B5
  EXPECT_EQ(micro_sign.text, "um");
  EXPECT_DOUBLE_EQ(micro_sign.factor, 1e-6);
  const Unit greek_mu = Parse("\xCE\xBCm");  // μm, U+03BC
  EXPECT_EQ(greek_mu.text, "um");
  EXPECT_DOUBLE_EQ(greek_mu.factor, 1e-6);

  const Unit htc = Parse("W/(m\xC2\xB2\xC2\xB7K)");  // W/(m²·K)
  EXPECT_EQ(htc.text, "W/(m^2*K)");
  EXPECT_EQ(htc.dim, dim::kHeatTransferCoeff);
  EXPECT_EQ(Parse("W/(m\xC2\xB2\xE2\x8B\x85K)").text, "W/(m^2*K)");  // ⋅ dot operator
  EXPECT_EQ(Parse("m\xC2\xB3/s").text, "m^3/s");                     // m³/s
  EXPECT_EQ(Parse("s\xE2\x81\xBB\xC2\xB9").text, "s^-1");            // s⁻¹
  EXPECT_EQ(Parse("m^\xE2\x88\x92"
                  "2")
                .text,
            "m^-2");  // m^−2 (U+2212)

  const Unit spec = Parse(
      "J/(kg\xC2\xB7\xC2\xB0"
      "C)");  // J/(kg·°C)
  EXPECT_EQ(spec.text, "J/(kg*degC)");
  EXPECT_EQ(spec.offset, 0.0);
  EXPECT_EQ(spec.dim, dim::kSpecificHeat);
  // A lone degree sign is the angle degree.
  EXPECT_EQ(Parse("\xC2\xB0").text, "deg");
}

// --- Errors: message and the byte span of the culprit ------------------

void ExpectError(std::string_view text, const std::string& message, int offset, int length) {
  SCOPED_TRACE(std::string(text));
  const UnitError e = ParseError(text);
  EXPECT_EQ(e.message, message);
  EXPECT_EQ(e.offset, offset);
  EXPECT_EQ(e.length, length);
}

TEST(UnitParserTest, UnknownSymbols) {
  ExpectError("kw", "unknown unit 'kw'; did you mean 'kW'?", 0, 2);
  ExpectError("btu/h", "unknown unit 'btu'; did you mean 'Btu'?", 0, 3);
  ExpectError("W/(m^2*Kx)", "unknown unit 'Kx'", 7, 2);
  ExpectError("x", "unknown unit 'x'", 0, 1);
  ExpectError("kg/lbs", "unknown unit 'lbs'; did you mean 'lb'?", 3, 3);
  // Byte offsets: '²' takes two bytes.
  ExpectError("m\xC2\xB2/xyz", "unknown unit 'xyz'", 4, 3);
  // Δ only spells a temperature interval.
  ExpectError("\xCE\x94K", "unknown unit '\xCE\x94K'", 0, 3);
}

TEST(UnitParserTest, SyntaxErrors) {
  ExpectError("", "empty unit", 0, 1);
  ExpectError("  ", "empty unit", 0, 2);
  ExpectError("kg/(m*s", "unclosed '('", 3, 1);
  ExpectError("kg/m)", "unmatched ')'", 4, 1);
  ExpectError("m^", "expected an integer exponent after '^'", 1, 1);
  ExpectError("m^x", "expected an integer exponent after '^'", 1, 1);
  ExpectError("m^2.5", "expected an integer exponent after '^'", 1, 1);
  ExpectError("m^-", "expected an integer exponent after '^'", 1, 1);
  ExpectError("m^2^3", "unexpected '^'", 3, 1);
  ExpectError("m2", "missing '^' before exponent '2'", 1, 1);
  ExpectError("m/", "expected a unit after '/'", 2, 1);
  ExpectError("/m", "expected a unit before '/'", 0, 1);
  ExpectError("m**s", "expected a unit before '*'", 2, 1);
  ExpectError("()", "expected a unit before ')'", 1, 1);
  ExpectError("m s", "missing '*' or '/' between units", 2, 1);
  ExpectError("m(s)", "missing '*' or '/' between units", 1, 1);
  ExpectError("m#", "unexpected character '#'", 1, 1);
  ExpectError("m\xE2\x84\xA6", "unexpected character '\xE2\x84\xA6'", 1, 3);  // Ω
  ExpectError("2/m", "unexpected number '2' in a unit", 0, 1);
  ExpectError("1.5*m", "unexpected number '1.5' in a unit", 0, 3);
}

TEST(UnitParserTest, RangeErrors) {
  ExpectError("m^100", "exponent too large", 1, 4);
  ExpectError("(m^40)^2", "exponent too large", 0, 8);
  // 1e24^20 overflows a double.
  ExpectError("Ym^20", "unit factor out of range", 0, 5);
}

TEST(UnitParserTest, DeepNestingIsAnErrorNotACrash) {
  const std::string deep = std::string(10000, '(') + "m" + std::string(10000, ')');
  ExpectError(deep, "parentheses nested too deeply", 32, 1);
  const std::string ok = std::string(32, '(') + "m" + std::string(32, ')');
  EXPECT_EQ(Parse(ok).dim, dim::kLength);
}

// Arbitrary bytes from a fixed-seed generator: every input either parses to a
// finite, positive factor or fails with a span inside the text.
TEST(UnitParserTest, ArbitraryInputStaysInBounds) {
  const std::string alphabet =
      std::string("mkgsKWPa()*/^-12 %.#degCF") + "\xC2\xB0\xCE\x94\xC2\xB2";
  std::mt19937 rng(12345);
  std::uniform_int_distribution<size_t> pick(0, alphabet.size() - 1);
  std::uniform_int_distribution<int> length(0, 12);
  int parsed = 0;
  for (int i = 0; i < 20000; ++i) {
    std::string text;
    for (int n = length(rng); n > 0; --n) text += alphabet[pick(rng)];
    Unit u;
    UnitError error;
    if (ParseUnit(text, &u, &error)) {
      ++parsed;
      EXPECT_TRUE(std::isfinite(u.factor) && u.factor > 0) << text;
    } else {
      EXPECT_FALSE(error.message.empty()) << text;
      EXPECT_GE(error.offset, 0) << text;
      EXPECT_GE(error.length, 1) << text;
      EXPECT_LE(error.offset, static_cast<int>(text.size())) << text;
      EXPECT_LE(error.offset + error.length, static_cast<int>(text.size()) + 1) << text;
    }
  }
  EXPECT_GT(parsed, 0);
}

TEST(UnitParserTest, NullErrorPointerIsAllowed) {
  Unit u;
  EXPECT_FALSE(ParseUnit("furlong", &u, nullptr));
}

}  // namespace
}  // namespace heatdeck::units
