/**
 * Surface coefficient for heating a charge in a furnace, when the plan does not give one.
 *
 * Common practice: radiation dominates in a hot furnace, so the coefficient is the
 * linearised radiation exchange of a small grey body in a large enclosure plus a
 * natural-convection term,
 *
 *   h = h_conv + ε σ (T_f² + T_s²)(T_f + T_s)    (kelvin; Incropera et al., §1.2.3, eq. 1.9),
 *
 * with ε = 0.8 (oxidised steel) and h_conv = 10 W/m²K (still furnace atmosphere).
 * The surface temperature T_s is taken midway between charge and furnace: the true
 * coefficient rises towards the end of heat-up, so the midway value is the lower,
 * slower (conservative) side for the time to reach soak temperature.
 */
export const FURNACE_EMISSIVITY = 0.8
export const FURNACE_CONVECTION_W_m2K = 10
/** CODATA 2018. */
export const STEFAN_BOLTZMANN_W_m2K4 = 5.670374419e-8

export function furnaceCoefficient_W_m2K(furnace_C: number, charge_C: number): number {
  const Tf = furnace_C + 273.15
  const Ts = (furnace_C + charge_C) / 2 + 273.15
  return FURNACE_CONVECTION_W_m2K + FURNACE_EMISSIVITY * STEFAN_BOLTZMANN_W_m2K4 * (Tf * Tf + Ts * Ts) * (Tf + Ts)
}
