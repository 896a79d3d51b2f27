/** The cookie that keeps field mode on for a device; the root layout reads it, the header's button sets it. */
export const FIELD_MODE_COOKIE = "loamwork-field-mode";
