/** Small helpers so that messages read as a person would write them: "1 link", "an abandon". */

/** `1 link`, `2 links`; `many` for words whose plural is not the word with an s. */
export function plural(n: number, word: string, many = `${word}s`): string {
  return `${n} ${n === 1 ? word : many}`;
}

/** "a" or "an" for the word that follows (by its first letter, which suits the words bellstep uses). */
export function article(word: string): string {
  return /^[aeiou]/i.test(word.replace(/^["'`]/, '')) ? 'an' : 'a';
}
