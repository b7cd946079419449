#!/usr/bin/env bash
# shaftwork state: the layout of rate's table, given values marked, US units, species by name.
source "$(dirname "$0")/checks.bash"

"$bin" state --fluid steam --pressure "10 bar" --temperature "300 degC" >"$tmp/steam.txt"
expect "state exits 0" $?
head -n 1 "$tmp/steam.txt" | grep -qxF "steam (iapws-if97)"
expect "the header names the fluid and the model, no more" $? "$(head -n 1 "$tmp/steam.txt")"
grep -qE '^  pressure +10 bar +given$' "$tmp/steam.txt"
expect "the given pressure in its own unit, marked given" $? "$(cat "$tmp/steam.txt")"
# python3-iapws: IAPWS97(P=1, T=573.15).h = 3051.703 kJ/kg.
grep -qE '^  enthalpy +3051.7 kJ/kg$' "$tmp/steam.txt"
expect "enthalpy in kJ/kg" $? "$(cat "$tmp/steam.txt")"

# A species by name (an ideal gas on its NASA polynomial), in US units.
"$bin" state --fluid CO2 --pressure "150 psia" --temperature "100 degF" --units us >"$tmp/co2.txt"
expect "a species names a fluid" $? "$(cat "$tmp/co2.txt")"
grep -qE '^  density +[0-9.]+ lb/ft3$' "$tmp/co2.txt" && grep -qE '^  cp +[0-9.]+ Btu/\(lb R\)$' "$tmp/co2.txt"
expect "--units us writes lb/ft3 and Btu/(lb R)" $? "$(cat "$tmp/co2.txt")"
# Ideal gas: rho = p M / (R T) = 150 psia * 44.0095 g/mol / (8.31446 J/(mol K) * 310.928 K)
#   = 1034214 Pa * 0.0440095 / 2585.20 = 17.606 kg/m3 = 1.0991 lb/ft3 (0.0624280 lb/ft3 per kg/m3, NIST SP 811).
grep -qE '^  density +1\.0991[0-9]* lb/ft3$' "$tmp/co2.txt"
expect "CO2 density from p M / (R T)" $? "$(grep density "$tmp/co2.txt")"

# A wet state shows its quality instead of cp and cv. python3-iapws at 0.1 MPa: hf = 417.436,
# hg = 2674.950 kJ/kg, so x = (2000 - hf)/(hg - hf) = 0.70102.
"$bin" state --fluid steam --pressure "1 bar" --enthalpy "2000 kJ/kg" >"$tmp/wet.txt"
grep -qE '^  quality +0\.7010 +vapour mass fraction$' "$tmp/wet.txt" && ! grep -q '^  cp ' "$tmp/wet.txt"
expect "a wet state shows its quality" $? "$(cat "$tmp/wet.txt")"

# At water's critical point cp diverges: IF97's region 3 gives a cp of any sign and size
# there, which is not printed as a number (nor k); cv is finite (python3-iapws 4.54 kJ/(kg K)).
"$bin" state --fluid steam --pressure "22.064 MPa" --enthalpy "2087.546845 kJ/kg" >"$tmp/critical.txt"
grep -qF '  cp                             not defined here: at the critical point cp diverges' "$tmp/critical.txt" &&
  ! grep -q 'k = cp/cv' "$tmp/critical.txt" && grep -q '  cv                             4.53' "$tmp/critical.txt"
expect "the critical point prints no cp and no k" $? "$(cat "$tmp/critical.txt")"
"$bin" state --fluid steam --pressure "22.064 MPa" --enthalpy "2087.546845 kJ/kg" --format json >"$tmp/critical.json"
grep -q '"cp": null' "$tmp/critical.json" && grep -q '"k": null' "$tmp/critical.json"
expect "the critical point's JSON has cp and k null" $? "$(cat "$tmp/critical.json")"

finish
