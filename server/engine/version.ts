/** Engine version recorded in every result; bump on any change that can alter a number. */
export const ENGINE_VERSION = '1.2.0'; // 1.1.0: the Monte Carlo result carries a histogram of r; 1.2.0: corrected rise, heat-leak fit, energy equivalent
