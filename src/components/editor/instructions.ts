/** Our own words for carrying parts with the keyboard (read by screen readers, shown on request). */
export const INSTRUCTIONS_ID = 'cage-editor-instructions';

export const INSTRUCTIONS =
  'To pick up a part, press Space. Carry it with the arrow keys: left and right step along the rotor from slot to slot, ' +
  'up and down go to the band above or below. Press Space again to put it down, or Escape to put it back. ' +
  'In the drawing, the arrow keys also move between slots, and Delete takes the part off the slot you are on.';
