// The raw-text nesting count the request guard runs before any JSON is parsed
// (server/utils/validation.ts jsonDepthOver). Depths are counted by hand from
// the JSON grammar (RFC 8259: only [ and { open a level; inside a string,
// backslash escapes the next character); JSON.parse confirms each text is JSON.
import { describe, expect, it } from 'vitest'
import { jsonDepthOver, unstorableText } from '../../../server/utils/validation'

const bytes = (s: string) => new TextEncoder().encode(s)
const over = (s: string, max: number) => {
  JSON.parse(s)
  return jsonDepthOver(bytes(s), max)
}

describe('jsonDepthOver', () => {
  it('counts arrays and objects alike, and only past the limit', () => {
    expect(over('[[[1]]]', 3)).toBe(false)
    expect(over('[[[1]]]', 2)).toBe(true)
    expect(over('{"a":{"b":[{}]}}', 4)).toBe(false)
    expect(over('{"a":{"b":[{}]}}', 3)).toBe(true)
    // Siblings do not add up: depth is how far in, not how many.
    expect(over('[[],[],[],[],[]]', 2)).toBe(false)
  })

  it('does not count brackets inside strings, escaped quotes included', () => {
    expect(over(JSON.stringify({ a: '[[[[[[{{{{' }), 1)).toBe(false)
    expect(over(JSON.stringify({ a: 'say \\"[[[[' }), 1)).toBe(false)
    expect(over(JSON.stringify(['"[[[', '\\', ['x']]), 2)).toBe(false)
    expect(over(JSON.stringify(['"[[[', '\\', [['x']]]), 2)).toBe(true)
  })

  it('stops a 4,000-deep text at the default limit of 32', () => {
    expect(jsonDepthOver(bytes(`${'['.repeat(4000)}${']'.repeat(4000)}`))).toBe(true)
    expect(jsonDepthOver(bytes(`${'['.repeat(32)}${']'.repeat(32)}`))).toBe(false)
  })
})

describe('unstorableText walks without recursion', () => {
  it('names a NUL 10,000 levels down without overflowing the stack', () => {
    let value: unknown = 'x\u0000'
    for (let i = 0; i < 10_000; i++) value = [value]
    expect(unstorableText(value)).toBe(Array(10_000).fill('0').join('.'))
  })
})
