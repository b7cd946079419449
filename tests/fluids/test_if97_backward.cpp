// Backward equations against their verification tables, at the digits printed there:
//   IAPWS R7-97(2012) Table 7 (T(p,h) region 1, Eq. 11), Table 9 (T(p,s) region 1, Eq. 13),
//   Table 24 (T(p,h) region 2, Eqs. 22-24), Table 29 (T(p,s) region 2, Eqs. 25-27), and the
//   check values printed with the B2bc equations (Eqs. 20, 21);
//   IAPWS SR3-03(2014) Table 5 (T(p,h) region 3, Eqs. 2, 3), Table 8 (v(p,h), Eqs. 4, 5),
//   Table 12 (T(p,s), Eqs. 6, 7), Table 15 (v(p,s), Eqs. 8, 9), and the check value printed
//   with the B3ab equation (Eq. 1).
#include <catch2/catch.hpp>

#include "fluids/if97_printed_digits.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

using shaftwork::test::PrintedDigits;
namespace if97 = shaftwork::fluids::if97;

namespace {

// (p in MPa, h in kJ/kg or s in kJ/(kg K), the printed result)
struct Row {
  double p;
  double x;
  double expected;
};

}  // namespace

TEST_CASE("IF97 Table 7: T(p,h) of region 1, Eq. 11", "[if97][backward]") {
  const Row rows[] = {{3, 500, 0.391798509e3}, {80, 500, 0.378108626e3}, {80, 1500, 0.611041229e3}};
  for (const Row& r : rows) {
    INFO("Table 7, p = " << r.p << " MPa, h = " << r.x << " kJ/kg");
    CHECK_THAT(if97::region1_T_ph(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 9));
  }
}

TEST_CASE("IF97 Table 9: T(p,s) of region 1, Eq. 13", "[if97][backward]") {
  const Row rows[] = {{3, 0.5, 0.307842258e3}, {80, 0.5, 0.309979785e3}, {80, 3, 0.565899909e3}};
  for (const Row& r : rows) {
    INFO("Table 9, p = " << r.p << " MPa, s = " << r.x << " kJ/(kg K)");
    CHECK_THAT(if97::region1_T_ps(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 9));
  }
}

TEST_CASE("IF97 Eqs. 20 and 21: the B2bc boundary and its printed check values", "[if97][backward]") {
  // IF97 Sec. 6.3.1: h = 0.3516004323e4 kJ/kg gives p = 0.100000000e3 MPa, and back.
  CHECK_THAT(if97::b2bc_pressure(0.3516004323e7) / 1e6, PrintedDigits(0.100000000e3, 9));
  CHECK_THAT(if97::b2bc_enthalpy(100e6) / 1e3, PrintedDigits(0.3516004323e4, 10));
}

TEST_CASE("IF97 Table 24: T(p,h) of region 2, Eqs. 22-24, and the subregions", "[if97][backward]") {
  using S = if97::Subregion2;
  struct RowS {
    double p, h, T;
    S sub;
  };
  const RowS rows[] = {
      {0.001, 3000, 0.534433241e3, S::a}, {3, 3000, 0.575373370e3, S::a}, {3, 4000, 0.101077577e4, S::a},
      {5, 3500, 0.801299102e3, S::b},     {5, 4000, 0.101531583e4, S::b}, {25, 3500, 0.875279054e3, S::b},
      {40, 2700, 0.743056411e3, S::c},    {60, 2700, 0.791137067e3, S::c}, {60, 3200, 0.882756860e3, S::c},
  };
  for (const RowS& r : rows) {
    INFO("Table 24, p = " << r.p << " MPa, h = " << r.h << " kJ/kg");
    CHECK(if97::region2_subregion_ph(r.p * 1e6, r.h * 1e3) == r.sub);
    CHECK_THAT(if97::region2_T_ph(r.p * 1e6, r.h * 1e3), PrintedDigits(r.T, 9));
  }
}

TEST_CASE("IF97 Table 29: T(p,s) of region 2, Eqs. 25-27, and the subregions", "[if97][backward]") {
  using S = if97::Subregion2;
  struct RowS {
    double p, s, T;
    S sub;
  };
  const RowS rows[] = {
      {0.1, 7.5, 0.399517097e3, S::a},  {0.1, 8, 0.514127081e3, S::a},  {2.5, 8, 0.103984917e4, S::a},
      {8, 6, 0.600484040e3, S::b},      {8, 7.5, 0.106495556e4, S::b},  {90, 6, 0.103801126e4, S::b},
      {20, 5.75, 0.697992849e3, S::c},  {80, 5.25, 0.854011484e3, S::c}, {80, 5.75, 0.949017998e3, S::c},
  };
  for (const RowS& r : rows) {
    INFO("Table 29, p = " << r.p << " MPa, s = " << r.s << " kJ/(kg K)");
    CHECK(if97::region2_subregion_ps(r.p * 1e6, r.s * 1e3) == r.sub);
    CHECK_THAT(if97::region2_T_ps(r.p * 1e6, r.s * 1e3), PrintedDigits(r.T, 9));
  }
}

TEST_CASE("SR3-03 Eq. 1: the B3ab boundary and its printed check value", "[if97][backward][region3]") {
  CHECK_THAT(if97::b3ab_enthalpy(25e6) / 1e3, PrintedDigits(2095.936454, 10));
}

TEST_CASE("SR3-03 Table 5: T(p,h) of region 3, Eqs. 2 and 3", "[if97][backward][region3]") {
  const Row rows[] = {{20, 1700, 629.3083892}, {50, 2000, 690.5718338}, {100, 2100, 733.6163014},
                      {20, 2500, 641.8418053}, {50, 2400, 735.1848618}, {100, 2700, 842.0460876}};
  for (const Row& r : rows) {
    INFO("SR3-03 Table 5, p = " << r.p << " MPa, h = " << r.x << " kJ/kg");
    CHECK_THAT(if97::region3_T_ph(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 10));
  }
}

TEST_CASE("SR3-03 Table 8: v(p,h) of region 3, Eqs. 4 and 5", "[if97][backward][region3]") {
  const Row rows[] = {{20, 1700, 1.749903962e-3}, {50, 2000, 1.908139035e-3}, {100, 2100, 1.676229776e-3},
                      {20, 2500, 6.670547043e-3}, {50, 2400, 2.801244590e-3}, {100, 2700, 2.404234998e-3}};
  for (const Row& r : rows) {
    INFO("SR3-03 Table 8, p = " << r.p << " MPa, h = " << r.x << " kJ/kg");
    CHECK_THAT(if97::region3_v_ph(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 10));
  }
}

TEST_CASE("SR3-03 Table 12: T(p,s) of region 3, Eqs. 6 and 7", "[if97][backward][region3]") {
  const Row rows[] = {{20, 3.8, 628.2959869}, {50, 3.6, 629.7158726}, {100, 4.0, 705.6880237},
                      {20, 5.0, 640.1176443}, {50, 4.5, 716.3687517}, {100, 5.0, 847.4332825}};
  for (const Row& r : rows) {
    INFO("SR3-03 Table 12, p = " << r.p << " MPa, s = " << r.x << " kJ/(kg K)");
    CHECK_THAT(if97::region3_T_ps(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 10));
  }
}

TEST_CASE("SR3-03 Table 15: v(p,s) of region 3, Eqs. 8 and 9", "[if97][backward][region3]") {
  const Row rows[] = {{20, 3.8, 1.733791463e-3}, {50, 3.6, 1.469680170e-3}, {100, 4.0, 1.555893131e-3},
                      {20, 5.0, 6.262101987e-3}, {50, 4.5, 2.332634294e-3}, {100, 5.0, 2.449610757e-3}};
  for (const Row& r : rows) {
    INFO("SR3-03 Table 15, p = " << r.p << " MPa, s = " << r.x << " kJ/(kg K)");
    CHECK_THAT(if97::region3_v_ps(r.p * 1e6, r.x * 1e3), PrintedDigits(r.expected, 10));
  }
}
