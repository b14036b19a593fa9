/**
 * One way to count things in words, so no screen or e-mail says "1 trees": English plural rules
 * from Intl.PluralRules (CLDR), with the plural form given where it is not the singular plus "s".
 */
const englishPlural = new Intl.PluralRules('en-US');

/** The word for `count` things: plural('tree', 1) → "tree", plural('variety', 2, 'varieties') → "varieties". */
export function plural(singular: string, count: number, pluralForm = `${singular}s`): string {
  return englishPlural.select(count) === 'one' ? singular : pluralForm;
}

/** The count with its word: countOf(1, 'tree') → "1 tree", countOf(1200, 'report') → "1,200 reports". */
export function countOf(count: number, singular: string, pluralForm?: string): string {
  return `${count.toLocaleString('en-US')} ${plural(singular, count, pluralForm)}`;
}
