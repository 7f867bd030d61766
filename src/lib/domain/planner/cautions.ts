/**
 * The safety cautions shown at the head of every list of work on the cage: change steps,
 * printable parts sheets. They defer to the machine's operator's manual, local regulations and
 * licensed practice, which always come first.
 */
export const WORK_CAUTIONS: readonly string[] = [
  'Working in or under the cage can kill or maim.',
  'Engine off, key out and in your pocket before anyone reaches into the cage.',
  'Wait until the rotor has stopped: it coasts for a while after the drive is off.',
  'Block every raised part so nothing can come down while you work.',
  'Cage elements are heavy: use a helper or a lifting aid, and wear gloves against wires and edges.',
  'Put every guard and shield back before the engine is started again.',
  'The operator’s manual of the machine, local regulations and licensed practice come before these steps.',
];

/**
 * Above this mass a part is a two-person or lifting-aid job: 23 kg (51 lb) is the load constant
 * of the NIOSH lifting equation (Waters et al., Ergonomics 36(7):749, 1993), the most anyone
 * should lift alone under ideal conditions.
 */
export const ONE_PERSON_LIFT_KG = 23;
