/**
 * The checklist of a service that has none of its own: the work of a usual suspension service,
 * in Loamline's words (common practice, no source). A technician adds or removes items per report.
 */
export const DEFAULT_CHECKLIST: readonly string[] = [
  'Air let out; stanchions, shaft and seals checked for scoring and leaks',
  'Lowers or air can off, cleaned, fresh bath oil and grease',
  'Dust wipers and foam rings replaced',
  'Bushings checked for play',
  'Damper oil level and condition checked',
  "Air chambers set for the rider's weight, sag measured on the bike",
  'Rebound and compression set, counted from closed',
  'Bolts torqued to spec, test ride',
];
