/**
 * Holdfire is a planning and record aid, not a safety authority. Every result
 * that involves a distance or a pressure carries this text so no screen can
 * show a number without it.
 */
export const CAUTION_GOVERNING_CODE =
  'Holdfire is a planning and record aid, not a safety authority. ' +
  "The site's governing code and its licensed authority decide the distances, pressures and limits that apply.";
