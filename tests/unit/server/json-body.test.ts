import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { createApp, defineEventHandler, toNodeListener } from 'h3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { JsonDepthMeter, readJsonBody, sizeText } from '../../../server/utils/json-body'
import { sendLargeBody } from '../../support/large-body'

const MiB = 1024 * 1024
const bytes = (s: string) => new TextEncoder().encode(s)

describe('JsonDepthMeter', () => {
  it.each([
    ['1', 0],
    ['{}', 1],
    ['{"a":[1,[2,{"b":3}]]}', 4],
    ['[[],[[]],[]]', 3],
    // Brackets inside strings, escaped quotes and escaped backslashes do not count.
    ['{"a":"[[[{{{"}', 1],
    ['["\\"[[[", "x\\\\", [1]]', 2],
    ['["é∑😀[", {"ü": []}]', 3]
  ])('%s nests %i deep', (text, depth) => {
    expect(new JsonDepthMeter().feed(bytes(text))).toBe(depth)
  })

  it('gives the same answer whatever the chunk boundaries', () => {
    const text = bytes('{"a":"x\\"[[","b":[[["\\\\"],{"c":"]]"}]]}')
    const whole = new JsonDepthMeter().feed(text)
    for (let cut = 1; cut < text.length; cut++) {
      const meter = new JsonDepthMeter()
      meter.feed(text.subarray(0, cut))
      expect(meter.feed(text.subarray(cut))).toBe(whole)
    }
    expect(whole).toBe(4)
  })
})

describe('sizeText', () => {
  it.each([[MiB, '1 MiB'], [16 * MiB, '16 MiB'], [512 * 1024, '512 KiB'], [1.5 * MiB, '1.50 MiB'], [1000, '1000 bytes']])('%i → %s', (n, text) => {
    expect(sizeText(n)).toBe(text)
  })
})

describe('readJsonBody', () => {
  let server: Server
  let url: string
  // Bytes the server had taken off the connection when it answered.
  let lastBytesRead = 0
  beforeAll(async () => {
    const app = createApp({ onAfterResponse: (event) => { lastBytesRead = event.node.req.socket.bytesRead } })
    app.use('/read', defineEventHandler(async event => ({ body: await readJsonBody(event, { maxBytes: 64 * 1024, maxDepth: 8 }) ?? null })))
    server = createServer(toNodeListener(app))
    await new Promise<void>(resolve => server.listen(0, '127.0.0.1', resolve))
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/read`
  })
  afterAll(() => new Promise<void>(resolve => server.close(() => resolve())))

  const post = (body: string, headers: Record<string, string> = { 'content-type': 'application/json' }) =>
    fetch(url, { method: 'POST', headers, body }).then(async r => ({ status: r.status, body: await r.json() }))

  it('parses a body within the limits, and an empty one as nothing', async () => {
    expect(await post('{"a":[1,2,{"b":"c"}]}')).toEqual({ status: 200, body: { body: { a: [1, 2, { b: 'c' }] } } })
    expect(await post('')).toEqual({ status: 200, body: { body: null } })
    expect(await post('\uFEFF{"a":1}')).toEqual({ status: 200, body: { body: { a: 1 } } })
  })

  it('drops "__proto__" keys instead of handing them on', async () => {
    const res = await post('{"__proto__":{"polluted":1},"a":{"\\u005f_proto__":{"x":1},"b":2}}')
    expect(res.body.body).toEqual({ a: { b: 2 } })
    expect(Object.keys(res.body.body)).toEqual(['a'])
  })

  it('refuses a declared length over the limit before reading', async () => {
    const res = await sendLargeBody({ url, head: '{"a":"', tail: '"}', totalBytes: 8 * MiB })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toBe('The request body is larger than the limit of 64 KiB')
    expect(res.uploadFinished).toBe(false)
  })

  it('stops reading an undeclared body as soon as it passes the limit', async () => {
    const res = await sendLargeBody({ url, head: '{"a":"', tail: '"}', totalBytes: 32 * MiB, declareLength: false })
    expect(res.status).toBe(413)
    expect(lastBytesRead).toBeLessThan(MiB)
    expect(res.uploadFinished).toBe(false)
    expect(res.bytesSent).toBeLessThan(16 * MiB)
  })

  it('stops reading at the first chunk that nests too deep', async () => {
    const res = await sendLargeBody({ url, head: '', tail: '', fill: '[', totalBytes: 32 * MiB, declareLength: false })
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toBe('The JSON body is nested deeper than 8 levels of arrays and objects')
    expect(res.uploadFinished).toBe(false)
    expect(lastBytesRead).toBeLessThan(MiB)
    expect((await post('[[[[[[[[1]]]]]]]]')).status).toBe(200)
    expect((await post('[[[[[[[[[1]]]]]]]]]')).status).toBe(400)
  })

  it('refuses text that is not JSON, with line and column where the parser gives a position', async () => {
    const res = await post('{"a": 1,\n "b": 2 "c": 3}')
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toBe('The request body is not valid JSON')
    expect(res.body.data.issues[0]).toMatchObject({ line: 2, column: 9 })
    expect((await post('{"a": }')).body.data.issues[0].message).toMatch(/"\{"a": \}" is not valid JSON/)
  })
})
