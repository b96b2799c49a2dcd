/** A run of plain text, or a web address to render as a link. */
export type TextPart = { kind: 'text'; text: string } | { kind: 'link'; text: string; href: string }

/** http(s) addresses up to the next space or character that cannot stand in one unescaped. */
const URL_PATTERN = /https?:\/\/[^\s<>"']+/g
/** Sentence punctuation right after an address belongs to the sentence, not the address (common practice). */
const TRAILING_PUNCTUATION = /[.,;:!?)\]}]+$/

/**
 * Splits plain text (an e-mail body) into text and links, so a page can render the links
 * as anchors and everything else as text: the text is never interpreted as HTML.
 */
export function splitTextLinks(text: string): TextPart[] {
  const parts: TextPart[] = []
  let last = 0
  for (const match of text.matchAll(URL_PATTERN)) {
    const href = match[0].replace(TRAILING_PUNCTUATION, '')
    const start = match.index
    if (start > last) parts.push({ kind: 'text', text: text.slice(last, start) })
    parts.push({ kind: 'link', text: href, href })
    last = start + href.length
  }
  if (last < text.length) parts.push({ kind: 'text', text: text.slice(last) })
  return parts
}
