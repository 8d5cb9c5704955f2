/** The caution every response and every report carries (weld-rules.md section 6, our words). */
export const NOTICE =
  'Throatline checks the strength and detailing limits it lists against AISC 360-22; it is not a complete connection design ' +
  '(member limit states, block shear, fatigue, seismic provisions, lamellar tearing, fabrication and inspection requirements are outside these checks unless stated). ' +
  'Critical welds need qualified welding procedures, qualified welders and inspection (visual, and ultrasonic or radiographic testing where specified). ' +
  'Results must be reviewed and sealed by a licensed engineer and conform to the governing local building code.';

export const STANDARD = 'AISC 360-22';
