/** Largest company logo accepted (bytes): 1 MB. A PNG or JPEG, checked by content on the server. */
export const maxLogoBytes = 1024 * 1024;
