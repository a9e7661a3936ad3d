/**
 * English closed-class words (determiners, pronouns, prepositions, conjunctions, auxiliaries,
 * modals and a few degree adverbs), written for this project from the grammar's word classes.
 * They are the *prior* of the suggestions: a candidate only, each one still has to pass the
 * what-if check before it is suggested. Negations are listed too; the `protect` setting keeps
 * them out of suggestions by default, because removing them flips meaning.
 * Lower-case; the tokenizer's settings are applied to each before matching the vocabulary.
 */
export const ENGLISH_FUNCTION_WORDS: readonly string[] = [
  // articles and determiners
  'a', 'an', 'the', 'this', 'that', 'these', 'those', 'each', 'every', 'either', 'neither', 'some', 'any',
  'all', 'both', 'few', 'many', 'much', 'more', 'most', 'less', 'least', 'several', 'such', 'own', 'other',
  'another', 'same', 'what', 'which', 'whose', 'whatever', 'whichever',
  // personal, possessive, reflexive and relative pronouns
  'i', 'me', 'my', 'mine', 'myself', 'we', 'us', 'our', 'ours', 'ourselves', 'you', 'your', 'yours',
  'yourself', 'yourselves', 'he', 'him', 'his', 'himself', 'she', 'her', 'hers', 'herself', 'it', 'its',
  'itself', 'they', 'them', 'their', 'theirs', 'themselves', 'who', 'whom', 'whoever', 'one', 'ones',
  'someone', 'somebody', 'something', 'anyone', 'anybody', 'anything', 'everyone', 'everybody',
  'everything', 'nobody', 'nothing', 'none', 'no', 'not', 'nor', 'never', 'nowhere', 'cannot',
  // prepositions
  'about', 'above', 'across', 'after', 'against', 'along', 'among', 'amongst', 'around', 'as', 'at',
  'before', 'behind', 'below', 'beneath', 'beside', 'besides', 'between', 'beyond', 'by', 'despite',
  'down', 'during', 'except', 'for', 'from', 'in', 'inside', 'into', 'like', 'near', 'of', 'off', 'on',
  'onto', 'out', 'outside', 'over', 'past', 'per', 'since', 'than', 'through', 'throughout', 'till',
  'to', 'toward', 'towards', 'under', 'underneath', 'until', 'unto', 'up', 'upon', 'via', 'with',
  'within', 'without',
  // conjunctions and subordinators
  'and', 'but', 'or', 'so', 'yet', 'because', 'although', 'though', 'while', 'whilst', 'whereas',
  'if', 'unless', 'whether', 'once', 'when', 'whenever', 'where', 'wherever', 'whereby', 'why', 'how',
  'however', 'therefore', 'thus', 'hence', 'also', 'then', 'else', 'otherwise', 'instead',
  // auxiliaries and modals, with the forms wink-nlp's contractions expand to
  'be', 'am', 'is', 'are', 'was', 'were', 'been', 'being', 'have', 'has', 'had', 'having', 'do',
  'does', 'did', 'doing', 'done', 'will', 'would', 'shall', 'should', 'can', 'could', 'may', 'might',
  'must', 'ought', 'need', 'dare', "'s", "'re", "'ve", "'d", "'ll", "'m",
  // degree and sentence adverbs, existential there, infinitive marker, discourse fillers
  'very', 'too', 'quite', 'rather', 'just', 'only', 'even', 'still', 'already', 'again', 'ever',
  'here', 'there', 'now', 'well', 'almost', 'enough', 'perhaps', 'yes', 'oh', 'etc',
];

/**
 * Light words: very frequent verbs with little meaning of their own ("get", "make", "take"),
 * number words and vague nouns and adverbs. Not closed-class, so more often part of a topic than
 * the words above — they join the prior last, and the what-if decides for each group.
 */
export const ENGLISH_LIGHT_WORDS: readonly string[] = [
  'get', 'gets', 'got', 'gotten', 'getting', 'go', 'goes', 'went', 'gone', 'going', 'make', 'makes',
  'made', 'making', 'take', 'takes', 'took', 'taken', 'taking', 'come', 'comes', 'came', 'coming',
  'give', 'gives', 'gave', 'given', 'put', 'puts', 'keep', 'keeps', 'kept', 'let', 'lets', 'say',
  'says', 'said', 'see', 'sees', 'saw', 'seen', 'seem', 'seems', 'seemed', 'become', 'becomes',
  'became', 'find', 'found', 'show', 'shows', 'shown', 'call', 'called', 'use', 'used', 'using',
  'want', 'wants', 'wanted', 'know', 'knows', 'knew', 'known', 'think', 'thought', 'tell', 'told',
  'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'hundred',
  'thousand', 'first', 'second', 'third', 'last', 'next', 'thing', 'things', 'way', 'ways', 'lot',
  'lots', 'kind', 'sort', 'part', 'always', 'often', 'sometimes', 'usually', 'really', 'actually',
  'maybe', 'anyway', 'away', 'back', 'together', 'further', 'indeed', 'please', 'sure', 'ok', 'okay',
];
