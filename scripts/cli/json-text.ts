/**
 * JSON text → value, with a syntax error located by line and column. JSON.parse on Node 20
 * gives a character position for some errors and none for others ("Unexpected token"), so on
 * failure the text is scanned once more by a strict RFC 8259 recogniser that stops at the first
 * offending character.
 */

/** Line and column (both 1-based) of a character offset in a text. */
export function lineColumn(text: string, offset: number): { line: number, column: number } {
  let line = 1
  let lineStart = 0
  const end = Math.min(offset, text.length)
  for (let i = 0; i < end; i++) {
    if (text.charCodeAt(i) === 10) { line++; lineStart = i + 1 }
  }
  return { line, column: end - lineStart + 1 }
}

/**
 * Parses JSON text; on a syntax error throws an Error whose message reads
 * `<source>: not valid JSON at line L, column C: <what>`.
 * @example parseJsonText('{"a": }', 'study.json') // throws "study.json: not valid JSON at line 1, column 7: unexpected '}'"
 */
export function parseJsonText(text: string, source: string): unknown {
  try {
    return JSON.parse(text)
  } catch (e) {
    const { offset, what } = locateJsonError(text)
    if (offset < 0) throw new Error(`${source}: not valid JSON: ${(e as Error).message}`)
    const { line, column } = lineColumn(text, offset)
    throw new Error(`${source}: not valid JSON at line ${line}, column ${column}: ${what}`)
  }
}

/**
 * Offset and description of the first syntax error in `text` (RFC 8259 grammar). For valid
 * JSON returns offset −1.
 * @example locateJsonError('[1,]') // { offset: 3, what: "unexpected ']'" }
 */
export function locateJsonError(text: string): { offset: number, what: string } {
  const scanner = new Scanner(text)
  try {
    scanner.space()
    scanner.value()
    scanner.space()
    if (scanner.pos < text.length) scanner.fail('unexpected text after the end of the document')
    return { offset: -1, what: '' }
  } catch (e) {
    if (e instanceof SyntaxFault) return { offset: e.offset, what: e.message }
    throw e
  }
}

class SyntaxFault extends Error {
  constructor(readonly offset: number, message: string) { super(message) }
}

const NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y

class Scanner {
  pos = 0
  constructor(private readonly text: string) {}

  fail(what: string): never {
    throw new SyntaxFault(this.pos, what)
  }

  private unexpected(expected: string): never {
    if (this.pos >= this.text.length) this.fail(`the file ends where ${expected} was expected`)
    this.fail(`unexpected ${JSON.stringify(this.text[this.pos])} where ${expected} was expected`)
  }

  space(): void {
    while (this.pos < this.text.length && ' \t\n\r'.includes(this.text[this.pos]!)) this.pos++
  }

  value(): void {
    const c = this.text[this.pos]
    if (c === '{') return this.object()
    if (c === '[') return this.array()
    if (c === '"') return this.string()
    for (const word of ['true', 'false', 'null']) {
      if (this.text.startsWith(word, this.pos)) { this.pos += word.length; return }
    }
    NUMBER.lastIndex = this.pos
    const m = NUMBER.exec(this.text)
    if (m && m[0] !== '' && m[0] !== '-') { this.pos += m[0].length; return }
    this.unexpected('a value')
  }

  private object(): void {
    this.pos++
    this.space()
    if (this.text[this.pos] === '}') { this.pos++; return }
    for (;;) {
      if (this.text[this.pos] !== '"') this.unexpected('a property name in double quotes')
      this.string()
      this.space()
      if (this.text[this.pos] !== ':') this.unexpected("':'")
      this.pos++
      this.space()
      this.value()
      this.space()
      const c = this.text[this.pos]
      if (c === '}') { this.pos++; return }
      if (c !== ',') this.unexpected("',' or '}'")
      this.pos++
      this.space()
    }
  }

  private array(): void {
    this.pos++
    this.space()
    if (this.text[this.pos] === ']') { this.pos++; return }
    for (;;) {
      this.value()
      this.space()
      const c = this.text[this.pos]
      if (c === ']') { this.pos++; return }
      if (c !== ',') this.unexpected("',' or ']'")
      this.pos++
      this.space()
    }
  }

  private string(): void {
    this.pos++
    while (this.pos < this.text.length) {
      const code = this.text.charCodeAt(this.pos)
      if (code === 34) { this.pos++; return }
      if (code < 32) this.fail('a control character (such as a line break) inside a string')
      if (code === 92) {
        const next = this.text[this.pos + 1]
        if (next === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(this.text.slice(this.pos + 2, this.pos + 6))) this.fail('a \\u escape needs four hex digits')
          this.pos += 6
          continue
        }
        if (next === undefined || !'"\\/bfnrt'.includes(next)) this.fail('an invalid escape sequence in a string')
        this.pos += 2
        continue
      }
      this.pos++
    }
    this.fail('the file ends inside a string')
  }
}
