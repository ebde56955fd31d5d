// Worker-thread entry: reads uploaded SVG files one at a time, off the API's event loop.
import { parentPort } from 'node:worker_threads'
import { importSvg, SvgReadError, type ImportOptions } from '../../../shared/geometry/importSvg.js'
import { buildPreview } from '../../../shared/geometry/preview.js'
import { sanitizeSvg } from '../../../shared/geometry/sanitizeSvg.js'

parentPort!.on('message', (message: { index: number; text: string; options: ImportOptions }) => {
  try {
    const design = importSvg(message.text, message.options)
    parentPort!.postMessage({ index: message.index, ok: true, design, preview: buildPreview(design.pieces, design.cutLines, design.bbox), sanitizedSvg: sanitizeSvg(message.text) })
  } catch (error) {
    if (error instanceof SvgReadError) parentPort!.postMessage({ index: message.index, ok: false, code: error.code, message: error.message })
    else parentPort!.postMessage({ index: message.index, ok: false, code: 'unreadable', message: 'The file could not be read as a design', detail: error instanceof Error ? error.message : String(error) })
  }
})
