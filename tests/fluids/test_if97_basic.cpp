// IAPWS-IF97 basic equations against the computer-program verification tables of
// IAPWS R7-97(2012): Table 5 (region 1, Eq. 7), Table 15 (region 2, Eq. 15), Table 33
// (region 3, Eq. 28), Tables 35 and 36 (saturation line, Eqs. 30 and 31), Table 42
// (region 5, Eq. 32), and the check values printed with the B23 equations (Eqs. 5, 6).
// Every value is checked at the nine significant digits the release prints.
// (Table 18, the metastable-vapour equation, is not implemented and so not tested.)
#include <catch2/catch.hpp>

#include "fluids/if97_printed_digits.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

using shaftwork::fluids::if97::Point;
using shaftwork::test::PrintedDigits;
namespace if97 = shaftwork::fluids::if97;

namespace {

// One row of a verification table, in the release's units: p in MPa, T in K, v in m3/kg,
// h and u in kJ/kg, s and cp in kJ/(kg K), w in m/s.
struct Row {
  double T;
  double p;
  double v;
  double h;
  double u;
  double s;
  double cp;
  double w;
};

void check_row(const Point& pt, const Row& row) {
  CHECK_THAT(1.0 / pt.rho, PrintedDigits(row.v, 9));
  CHECK_THAT(pt.h / 1e3, PrintedDigits(row.h, 9));
  CHECK_THAT(pt.u() / 1e3, PrintedDigits(row.u, 9));
  CHECK_THAT(pt.s / 1e3, PrintedDigits(row.s, 9));
  CHECK_THAT(pt.cp / 1e3, PrintedDigits(row.cp, 9));
  CHECK_THAT(pt.w, PrintedDigits(row.w, 9));
}

}  // namespace

TEST_CASE("IF97 Table 5: region 1, Eq. 7", "[if97][region1]") {
  const Row rows[] = {
      {300, 3, 0.100215168e-2, 0.115331273e3, 0.112324818e3, 0.392294792, 0.417301218e1, 0.150773921e4},
      {300, 80, 0.971180894e-3, 0.184142828e3, 0.106448356e3, 0.368563852, 0.401008987e1, 0.163469054e4},
      {500, 3, 0.120241800e-2, 0.975542239e3, 0.971934985e3, 0.258041912e1, 0.465580682e1, 0.124071337e4},
  };
  for (const Row& row : rows) {
    INFO("Table 5, T = " << row.T << " K, p = " << row.p << " MPa");
    check_row(if97::region1(row.p * 1e6, row.T), row);
  }
}

TEST_CASE("IF97 Table 15: region 2, Eq. 15", "[if97][region2]") {
  const Row rows[] = {
      {300, 0.0035, 0.394913866e2, 0.254991145e4, 0.241169160e4, 0.852238967e1, 0.191300162e1, 0.427920172e3},
      {700, 0.0035, 0.923015898e2, 0.333568375e4, 0.301262819e4, 0.101749996e2, 0.208141274e1, 0.644289068e3},
      {700, 30, 0.542946619e-2, 0.263149474e4, 0.246861076e4, 0.517540298e1, 0.103505092e2, 0.480386523e3},
  };
  for (const Row& row : rows) {
    INFO("Table 15, T = " << row.T << " K, p = " << row.p << " MPa");
    check_row(if97::region2(row.p * 1e6, row.T), row);
  }
}

TEST_CASE("IF97 Table 33: region 3, Eq. 28, at given density", "[if97][region3]") {
  struct Row3 {
    double T, rho, p, h, u, s, cp, w;
  };
  const Row3 rows[] = {
      {650, 500, 0.255837018e2, 0.186343019e4, 0.181226279e4, 0.405427273e1, 0.138935717e2, 0.502005554e3},
      {650, 200, 0.222930643e2, 0.237512401e4, 0.226365868e4, 0.485438792e1, 0.446579342e2, 0.383444594e3},
      {750, 500, 0.783095639e2, 0.225868845e4, 0.210206932e4, 0.446971906e1, 0.634165359e1, 0.760696041e3},
  };
  for (const Row3& row : rows) {
    INFO("Table 33, T = " << row.T << " K, rho = " << row.rho << " kg/m3");
    const Point pt = if97::region3(row.rho, row.T);
    CHECK_THAT(pt.p / 1e6, PrintedDigits(row.p, 9));
    CHECK_THAT(pt.h / 1e3, PrintedDigits(row.h, 9));
    CHECK_THAT(pt.u() / 1e3, PrintedDigits(row.u, 9));
    CHECK_THAT(pt.s / 1e3, PrintedDigits(row.s, 9));
    CHECK_THAT(pt.cp / 1e3, PrintedDigits(row.cp, 9));
    CHECK_THAT(pt.w, PrintedDigits(row.w, 9));
  }
}

TEST_CASE("IF97 Table 42: region 5, Eq. 32", "[if97][region5]") {
  const Row rows[] = {
      {1500, 0.5, 0.138455090e1, 0.521976855e4, 0.452749310e4, 0.965408875e1, 0.261609445e1, 0.917068690e3},
      {1500, 30, 0.230761299e-1, 0.516723514e4, 0.447495124e4, 0.772970133e1, 0.272724317e1, 0.928548002e3},
      {2000, 30, 0.311385219e-1, 0.657122604e4, 0.563707038e4, 0.853640523e1, 0.288569882e1, 0.106736948e4},
  };
  for (const Row& row : rows) {
    INFO("Table 42, T = " << row.T << " K, p = " << row.p << " MPa");
    check_row(if97::region5(row.p * 1e6, row.T), row);
  }
}

TEST_CASE("IF97 Table 35: saturation pressure, Eq. 30", "[if97][region4]") {
  CHECK_THAT(if97::saturation_pressure(300) / 1e6, PrintedDigits(0.353658941e-2, 9));
  CHECK_THAT(if97::saturation_pressure(500) / 1e6, PrintedDigits(0.263889776e1, 9));
  CHECK_THAT(if97::saturation_pressure(600) / 1e6, PrintedDigits(0.123443146e2, 9));
}

TEST_CASE("IF97 Table 36: saturation temperature, Eq. 31", "[if97][region4]") {
  CHECK_THAT(if97::saturation_temperature(0.1e6), PrintedDigits(0.372755919e3, 9));
  CHECK_THAT(if97::saturation_temperature(1e6), PrintedDigits(0.453035632e3, 9));
  CHECK_THAT(if97::saturation_temperature(10e6), PrintedDigits(0.584149488e3, 9));
}

TEST_CASE("Eqs. 30 and 31 are inverses of each other", "[if97][region4]") {
  for (double T = 273.15; T < 647.09; T += 7.3) {
    INFO("T = " << T << " K");
    CHECK(if97::saturation_temperature(if97::saturation_pressure(T)) == Approx(T).epsilon(1e-13));
  }
}

TEST_CASE("IF97 B23 equations, Eqs. 5 and 6, with their printed check values", "[if97][b23]") {
  // IF97 Sec. 4: T = 0.623150000e3 K gives p = 0.165291643e2 MPa, and back.
  CHECK_THAT(if97::b23_pressure(623.15) / 1e6, PrintedDigits(0.165291643e2, 9));
  CHECK_THAT(if97::b23_temperature(0.165291643e8), PrintedDigits(0.623150000e3, 9));
}
