// text-readability ships no types. Only the members Dewline calls are declared.
declare module "text-readability" {
  interface Readability {
    lexiconCount(text: string, removePunctuation?: boolean): number;
    syllableCount(text: string, lang?: string): number;
    sentenceCount(text: string): number;
    fleschKincaidGrade(text: string): number;
  }
  const readability: Readability;
  export default readability;
}
