/**
 * Child-process entry for reading an uploaded font. fontkit can abort the whole V8
 * process on some damaged fonts (an allocation no try/catch can stop), so uploads are
 * read here, in a process of their own, and only the plain result travels back.
 */
import { importGlyphs, type GlyphSelection } from './font-import'

process.once('message', (msg: { buffer: Uint8Array; selection: GlyphSelection; limit: number }) => {
  const result = importGlyphs(Buffer.from(msg.buffer), msg.selection, msg.limit)
  process.send?.(result, () => process.exit(0))
})
