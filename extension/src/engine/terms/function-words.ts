/**
 * English closed-class words by grammatical class, written for this project from the grammar's
 * word classes (no outside list copied). They are the *prior* of the suggestions: each one is
 * still held to the corpus's own evidence (docs/methods.md §9) before it is suggested.
 * Lower-case; the tokenizer's settings are applied to each before matching the vocabulary.
 */
export const FUNCTION_WORD_CLASSES = {
  determiner: ['a', 'an', 'the', 'this', 'that', 'these', 'those', 'each', 'every', 'either', 'some', 'any', 'both',
    'such', 'own', 'other', 'another', 'same', 'what', 'which', 'whose', 'whatever', 'whichever'],
  pronoun: ['i', 'me', 'my', 'mine', 'myself', 'we', 'us', 'our', 'ours', 'ourselves', 'you', 'your', 'yours',
    'yourself', 'yourselves', 'he', 'him', 'his', 'himself', 'she', 'her', 'hers', 'herself', 'it', 'its',
    'itself', 'they', 'them', 'their', 'theirs', 'themselves', 'who', 'whom', 'whoever', 'someone', 'somebody',
    'something', 'anyone', 'anybody', 'anything', 'everyone', 'everybody', 'everything'],
  preposition: ['about', 'above', 'across', 'after', 'against', 'along', 'among', 'amongst', 'around', 'as', 'at',
    'before', 'behind', 'below', 'beneath', 'beside', 'besides', 'between', 'beyond', 'by', 'down', 'during',
    'for', 'from', 'in', 'inside', 'into', 'like', 'near', 'of', 'off', 'on', 'onto', 'out', 'outside', 'over',
    'past', 'per', 'since', 'through', 'throughout', 'till', 'to', 'toward', 'towards', 'under', 'underneath',
    'until', 'unto', 'up', 'upon', 'via', 'with', 'within'],
  conjunction: ['and', 'or', 'so', 'because', 'while', 'whilst', 'if', 'unless', 'whether', 'once', 'when',
    'whenever', 'where', 'wherever', 'whereby', 'why', 'how', 'therefore', 'thus', 'hence', 'also', 'then', 'else'],
  auxiliary: ['be', 'am', 'is', 'are', 'was', 'were', 'been', 'being', 'have', 'has', 'had', 'having', 'do',
    'does', 'did', 'doing', 'done', 'will', 'would', 'shall', 'should', 'can', 'could', 'may', 'might', 'must',
    'ought', "'s", "'re", "'ve", "'d", "'ll", "'m"],
  adverb: ['here', 'there', 'now', 'etc'],
} as const;

/**
 * Closed-class words that change what a sentence says rather than only how it is built:
 * negations, degree words (intensifiers), contrast and concession, quantity, number words, adverbs
 * of frequency. On opinion text they carry the opinion (docs/methods.md §8: every list that
 * removed them lowered precision on rated reviews), so the method only suggests them where they
 * are in more than half the documents of a corpus that does not read as opinion text.
 */
export const MEANING_WORDS = {
  negation: ['no', 'not', 'nor', 'never', 'none', 'nobody', 'nothing', 'nowhere', 'neither', 'cannot', 'without'],
  degree: ['very', 'too', 'quite', 'rather', 'just', 'only', 'even', 'still', 'already', 'again', 'ever', 'enough',
    'almost', 'really', 'well', 'much', 'more', 'most', 'less', 'least'],
  contrast: ['but', 'yet', 'however', 'although', 'though', 'whereas', 'despite', 'except', 'otherwise', 'instead',
    'than'],
  quantity: ['all', 'many', 'few', 'several'],
  // Cardinal and ordinal number words: they count rather than name ("two", "third"), and a
  // rating can be one ("one star"), hence with the words that carry meaning. Joined the prior in
  // the sixteenth session on the TUNE corpora (docs/methods.md §9).
  number: ['one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve',
    'twenty', 'thirty', 'forty', 'fifty', 'sixty', 'seventy', 'eighty', 'ninety', 'hundred', 'thousand', 'million',
    'billion', 'first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth', 'tenth'],
  // Adverbs of frequency: how often, not what ("usually", "rarely"); on opinion text they carry
  // the stance ("always breaks"). Joined the prior in the sixteenth session on the TUNE corpora.
  frequency: ['always', 'usually', 'often', 'sometimes', 'seldom', 'rarely', 'occasionally', 'frequently',
    'generally', 'normally', 'typically', 'commonly'],
} as const;

export type WordClass = keyof typeof FUNCTION_WORD_CLASSES | keyof typeof MEANING_WORDS;

/** Every word of the prior with its class. */
export function wordClasses(): Map<string, WordClass> {
  const out = new Map<string, WordClass>();
  for (const [cls, words] of Object.entries(MEANING_WORDS)) for (const w of words) out.set(w, cls as WordClass);
  for (const [cls, words] of Object.entries(FUNCTION_WORD_CLASSES)) for (const w of words) out.set(w, cls as WordClass);
  return out;
}

export function isMeaningClass(cls: WordClass): boolean {
  return cls in MEANING_WORDS;
}
