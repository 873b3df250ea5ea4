/** Engine version recorded in every result; bump on any change that can alter a number. */
// 1.1.0: the Monte Carlo result carries a histogram of r; 1.2.0: corrected rise, heat-leak fit, energy equivalent.
// 2.0.0: NASA Glenn Cp°, wall uptake C·ΔT on gas runs, volume offsets in n, real-gas ΔU, flags against propagated uncertainty.
// 2.1.0: the thermometer's gain in u(ΔT_c) and its own row in the energy-equivalent budget.
// 2.2.0: a gauge rated pressure is read above the barometric pressure; the over-pressure flag speaks kPa.
// 2.3.0: the correction a certificate in force states (reading × gain + offset) is applied to its instrument's readings.
export const ENGINE_VERSION = '2.3.0';
