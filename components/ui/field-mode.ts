/** Cookie holding the high-contrast field mode ("on" or absent); read by the root layout. */
export const FIELD_MODE_COOKIE = "sortie-field-mode";
