# A NASA-air compressor log for the batch benchmarks (bench/batch_compare.sh,
# bench/batch_uncertainty.sh): `rows` rows, fixed seed, inlet 15-30 degC at -20..+20 mbar
# gauge, outlet 6-8 barg, an outlet temperature from an isentropic efficiency of 0.78-0.84
# (constant-cp air, barometer 99.1 kPa), 5-6 t/h.
#   awk -v rows=1000000 -f bench/compressor_log.awk >log.csv
BEGIN {
  srand(20260302)
  print "id,inlet.pressure [barg],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],mass_flow [t/h]"
  for (i = 0; i < rows; i++) {
    t1 = 15 + 15 * rand(); p1 = -0.02 + 0.04 * rand(); p2 = 6 + 2 * rand(); eta = 0.78 + 0.06 * rand()
    T1 = t1 + 273.15; ratio = (p2 + 0.991) / (p1 + 0.991)
    T2 = T1 + T1 * (exp(log(ratio) * 0.4 / 1.4) - 1) / eta
    printf "%d,%.4f,%.2f,%.3f,%.2f,%.3f\n", i, p1, t1, p2, T2 - 273.15, 5 + rand()
  }
}
