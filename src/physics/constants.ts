/** Physical constants shared by every model. Values from the U.S. Standard Atmosphere, 1976. */

/** Standard gravity, m/s². */
export const G0 = 9.80665;
/** Specific gas constant of dry air, J/(kg K). */
export const R_AIR = 287.05287;
/** Ratio of specific heats of air. */
export const GAMMA = 1.4;
/** Effective Earth radius used to convert geometric to geopotential altitude, m. */
export const EARTH_RADIUS_GEOPOTENTIAL = 6_356_766;
/** Sea-level standard density, kg/m³: the reference for a "sea-level descent rate". */
export const RHO_SEA_LEVEL = 1.225;
