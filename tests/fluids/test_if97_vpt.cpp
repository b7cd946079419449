// SR5-05(2016), v(p,T) for region 3, against its verification tables at the printed digits:
// Table 3 (the subregion boundary equations T3xy(p), Eqs. 2 and 3), Table 5 (v(p,T) of
// subregions 3a-3t, Eqs. 4 and 5), Table 11 (the auxiliary boundaries T3uv and T3wx) and
// Table 13 (v(p,T) of the auxiliary subregions 3u-3z). Each row also checks that the
// subregion selection of SR5-05 Tables 2 and 10 picks the subregion the table names.
#include <string>

#include <catch2/catch.hpp>

#include "fluids/if97_printed_digits.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

using shaftwork::test::PrintedDigits;
namespace if97 = shaftwork::fluids::if97;
using B = if97::Boundary3;

TEST_CASE("SR5-05 Table 3: boundary equations T3xy(p), Eqs. 2 and 3", "[if97][vpt]") {
  struct Row {
    B boundary;
    double p_MPa;
    double T;
  };
  const Row rows[] = {
      {B::ab, 40, 693.0341408}, {B::cd, 25, 649.3659208}, {B::ef, 40, 713.9593992},
      {B::gh, 23, 649.8873759}, {B::ij, 23, 651.5778091}, {B::jk, 23, 655.8338344},
      {B::mn, 22.8, 649.6054133}, {B::op, 22.8, 650.0106943}, {B::qu, 22, 645.6355027},
      {B::rx, 22, 648.2622754},
  };
  for (const Row& r : rows) {
    INFO("SR5-05 Table 3, boundary " << static_cast<int>(r.boundary) << ", p = " << r.p_MPa << " MPa");
    CHECK_THAT(if97::region3_boundary_temperature(r.boundary, r.p_MPa * 1e6), PrintedDigits(r.T, 10));
  }
}

TEST_CASE("SR5-05 Table 11: auxiliary boundary equations T3uv(p) and T3wx(p)", "[if97][vpt]") {
  CHECK_THAT(if97::region3_boundary_temperature(B::uv, 22.3e6), PrintedDigits(647.7996121, 10));
  CHECK_THAT(if97::region3_boundary_temperature(B::wx, 22.3e6), PrintedDigits(648.2049480, 10));
}

namespace {

struct VRow {
  char subregion;
  double p_MPa;
  double T;
  double v;
};

void check_rows(const char* table, const VRow* begin, const VRow* end) {
  for (const VRow* r = begin; r != end; ++r) {
    INFO(table << ", subregion 3" << r->subregion << ", p = " << r->p_MPa << " MPa, T = " << r->T << " K");
    CHECK(if97::region3_subregion_pt(r->p_MPa * 1e6, r->T) == r->subregion);
    CHECK_THAT(if97::region3_v_pt(r->p_MPa * 1e6, r->T), PrintedDigits(r->v, 10));
    CHECK_THAT(if97::region3_v_pt_in(r->subregion, r->p_MPa * 1e6, r->T), PrintedDigits(r->v, 10));
  }
}

}  // namespace

TEST_CASE("SR5-05 Table 5: v(p,T) of subregions 3a-3t, Eqs. 4 and 5", "[if97][vpt]") {
  const VRow rows[] = {
      {'a', 50, 630, 1.470853100e-3},   {'a', 80, 670, 1.503831359e-3},
      {'b', 50, 710, 2.204728587e-3},   {'b', 80, 750, 1.973692940e-3},
      {'c', 20, 630, 1.761696406e-3},   {'c', 30, 650, 1.819560617e-3},
      {'d', 26, 656, 2.245587720e-3},   {'d', 30, 670, 2.506897702e-3},
      {'e', 26, 661, 2.970225962e-3},   {'e', 30, 675, 3.004627086e-3},
      {'f', 26, 671, 5.019029401e-3},   {'f', 30, 690, 4.656470142e-3},
      {'g', 23.6, 649, 2.163198378e-3}, {'g', 24, 650, 2.166044161e-3},
      {'h', 23.6, 652, 2.651081407e-3}, {'h', 24, 654, 2.967802335e-3},
      {'i', 23.6, 653, 3.273916816e-3}, {'i', 24, 655, 3.550329864e-3},
      {'j', 23.5, 655, 4.545001142e-3}, {'j', 24, 660, 5.100267704e-3},
      {'k', 23, 660, 6.109525997e-3},   {'k', 24, 670, 6.427325645e-3},
      {'l', 22.6, 646, 2.117860851e-3}, {'l', 23, 646, 2.062374674e-3},
      {'m', 22.6, 648.6, 2.533063780e-3}, {'m', 22.8, 649.3, 2.572971781e-3},
      {'n', 22.6, 649.0, 2.923432711e-3}, {'n', 22.8, 649.7, 2.913311494e-3},
      {'o', 22.6, 649.1, 3.131208996e-3}, {'o', 22.8, 649.9, 3.221160278e-3},
      {'p', 22.6, 649.4, 3.715596186e-3}, {'p', 22.8, 650.2, 3.664754790e-3},
      {'q', 21.1, 640, 1.970999272e-3}, {'q', 21.8, 643, 2.043919161e-3},
      {'r', 21.1, 644, 5.251009921e-3}, {'r', 21.8, 648, 5.256844741e-3},
      {'s', 19.1, 635, 1.932829079e-3}, {'s', 20, 638, 1.985387227e-3},
      {'t', 17, 626, 8.483262001e-3},   {'t', 20, 640, 6.227528101e-3},
  };
  check_rows("SR5-05 Table 5", std::begin(rows), std::end(rows));
}

TEST_CASE("SR5-05 Table 13: v(p,T) of the auxiliary subregions 3u-3z", "[if97][vpt]") {
  const VRow rows[] = {
      {'u', 21.5, 644.6, 2.268366647e-3},  {'u', 22, 646.1, 2.296350553e-3},
      {'v', 22.5, 648.6, 2.832373260e-3},  {'v', 22.3, 647.9, 2.811424405e-3},
      {'w', 22.15, 647.5, 3.694032281e-3}, {'w', 22.3, 648.1, 3.622226305e-3},
      {'x', 22.11, 648, 4.528072649e-3},   {'x', 22.3, 649, 4.556905799e-3},
      {'y', 22, 646.84, 2.698354719e-3},   {'y', 22.064, 647.05, 2.717655648e-3},
      {'z', 22, 646.89, 3.798732962e-3},   {'z', 22.064, 647.15, 3.701940009e-3},
  };
  check_rows("SR5-05 Table 13", std::begin(rows), std::end(rows));
}

TEST_CASE("SR5-05 subregions outside 3a-3z are refused", "[if97][vpt]") {
  try {
    if97::region3_v_pt_in('A', 25e6, 650);
    FAIL("no error thrown");
  } catch (const shaftwork::Error& e) {
    CHECK(e.kind() == shaftwork::ErrorKind::bad_input);
    CHECK(std::string(e.what()) == "iapws-if97: SR5-05 has subregions 3a to 3z, not 3A");
  }
}
