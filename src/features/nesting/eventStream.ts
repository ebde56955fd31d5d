/** One server-sent event: its type (`message` when the stream names none) and its data lines joined by newlines. */
export interface StreamEvent {
  event: string
  data: string
}

/**
 * Splits a text/event-stream into events as text arrives in chunks of any size, following the parsing rules of the
 * WHATWG HTML standard ("Parsing an event stream"): lines end in CRLF, LF or CR; a blank line dispatches; lines
 * starting with a colon are comments; `id` and `retry` are not needed here and are ignored.
 */
export function createEventStreamParser(onEvent: (event: StreamEvent) => void) {
  let pending = ''
  let eventType = ''
  let dataLines: string[] = []

  function dispatch(): void {
    // An event with no data line is dropped, as a browser's EventSource would.
    if (dataLines.length > 0) onEvent({ event: eventType || 'message', data: dataLines.join('\n') })
    eventType = ''
    dataLines = []
  }

  function readLine(line: string): void {
    if (line === '') return dispatch()
    if (line.startsWith(':')) return
    const colon = line.indexOf(':')
    const field = colon === -1 ? line : line.slice(0, colon)
    let value = colon === -1 ? '' : line.slice(colon + 1)
    if (value.startsWith(' ')) value = value.slice(1)
    if (field === 'event') eventType = value
    else if (field === 'data') dataLines.push(value)
  }

  /** Feeds decoded text; complete lines are read at once, a partial last line waits for the next chunk. */
  function push(text: string): void {
    pending += text
    const lineEnd = /\r\n|\r|\n/g
    let start = 0
    for (let match = lineEnd.exec(pending); match; match = lineEnd.exec(pending)) {
      // A CR at the very end may be the first half of a CRLF split across chunks.
      if (match[0] === '\r' && match.index === pending.length - 1) break
      readLine(pending.slice(start, match.index))
      start = match.index + match[0].length
    }
    pending = pending.slice(start)
  }

  /** The stream closed: an event without its closing blank line is incomplete and is dropped. */
  function end(): void {
    pending = ''
    eventType = ''
    dataLines = []
  }

  return { push, end }
}

/** Reads a byte stream to its end, handing each event over as it completes. Rejects when the connection breaks. */
export async function readEventStream(stream: ReadableStream<Uint8Array>, onEvent: (event: StreamEvent) => void): Promise<void> {
  const reader = stream.getReader()
  const decoder = new TextDecoder()
  const parser = createEventStreamParser(onEvent)
  try {
    for (;;) {
      const { done, value } = await reader.read()
      if (done) break
      parser.push(decoder.decode(value, { stream: true }))
    }
    parser.push(decoder.decode())
    parser.end()
  } finally {
    reader.releaseLock()
  }
}
