// The caution every finding carries whose fix touches hardware (DESIGN.md, Safety and
// deference). Gridmark assists scrutineers; it does not replace their judgement.
export const HARDWARE_CAUTION
  = 'Power the unit off before inserting or removing update media. Connect antennas before powering anything that transmits. '
    + 'Follow the manufacturer’s instructions. Airworthiness work is for licensed maintenance. '
    + 'Local procedures and the competition’s rules prevail over Gridmark’s defaults.'
