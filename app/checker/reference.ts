/**
 * Reference values for physical bodies.
 * Radii: PREM, Dziewonski & Anderson 1981, Phys. Earth Planet. Inter. 25, 297–356
 * (inner-core boundary 1221.5 km, core–mantle boundary 3480 km).
 * Rotation rate: WGS84 (NIMA TR8350.2), Ω = 7.292115e-5 rad/s.
 */

export interface ReferenceBody {
  name: string;
  innerRadiusKm: number;
  outerRadiusKm: number;
}

export const EARTH_CORE: ReferenceBody = {
  name: "Earth (PREM core)",
  innerRadiusKm: 1221.5,
  outerRadiusKm: 3480,
};

/** WGS84 mean angular velocity of the Earth, rad/s. */
export const EARTH_OMEGA = 7.292115e-5;
