// A fixed number of NASA-air state calls, for instruction counts that load does not move:
//   valgrind --tool=callgrind build-bench/bench/count_nasa_calls pt
//   valgrind --tool=callgrind build-bench/bench/count_nasa_calls ps
// docs/performance.md compares the counts before and after a change of the model.
#include <cstdio>
#include <cstring>
#include <vector>

#include "shaftwork/fluids/nasa_polynomial.hpp"

using namespace shaftwork::fluids;

int main(int argc, char** argv) {
  const SpeciesLibrary& lib = SpeciesLibrary::built_in();
  const NasaPolynomialGas air({{lib.find("N2"), 0.78084}, {lib.find("O2"), 0.209476}, {lib.find("Ar"), 0.009365},
                               {lib.find("CO2"), 0.000319}},
                              CompositionBasis::mole);
  const bool by_entropy = argc > 1 && std::strcmp(argv[1], "ps") == 0;
  std::vector<double> entropy;
  for (int i = 0; i < 64; ++i) entropy.push_back(air.from_pt(1e5 + i * 6e4, 250 + i * 18).entropy);
  double sum = 0;
  for (int i = 0; i < 200000; ++i) {
    const double p = 1e5 + (i % 64) * 6e4;
    sum += by_entropy ? air.from_ps(p, entropy[i % 64]).temperature : air.from_pt(p, 250 + (i % 64) * 18).density;
  }
  std::printf("%g\n", sum);
}
