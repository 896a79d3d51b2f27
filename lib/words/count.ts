/**
 * A count with its noun in the right number: "1 find", "3 finds", "0 finds", "1 e-mail". English plurals
 * through Intl.PluralRules, so a count never reads "1 finds" or "e-mail(s)".
 */
const rules = new Intl.PluralRules("en-GB");

export function countOf(n: number, one: string, other = `${one}s`): string {
  return `${n.toLocaleString("en-GB")} ${rules.select(n) === "one" ? one : other}`;
}
