// One collator for each way the engine orders text, made once: String#localeCompare with a locale
// or options builds a new collator on every call, which dominated the sort of thousands of testers.
// Intl.Collator(locales, options).compare orders exactly as localeCompare(that, locales, options).

/** Natural order ("2" before "10"), as localeCompare(b, 'en', { numeric: true }). */
export const naturalCompare = new Intl.Collator('en', { numeric: true }).compare;

/** The default locale's order, as a.localeCompare(b). */
export const textCompare = new Intl.Collator().compare;
