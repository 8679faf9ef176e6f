// The client address behind proxies. X-Forwarded-For semantics: each proxy
// appends the address it received the request from (MDN, X-Forwarded-For;
// RFC 7239 section 5.2 describes the same order for `Forwarded: for=`), so
// only the entries the trusted proxies wrote, counted from the right, are
// believed; the leftmost ones are whatever the client sent.
import { describe, expect, it } from 'vitest'
import { forwardedClient } from '../../../server/utils/client-address'

describe('forwardedClient', () => {
  it('ignores the header entirely when no proxy is trusted', () => {
    expect(forwardedClient('203.0.113.5', '10.0.0.2', 0)).toBe('10.0.0.2')
  })

  it('with one trusted proxy takes the rightmost entry, not a spoofed leftmost one', () => {
    // The client sent "X-Forwarded-For: 1.2.3.4"; the proxy appended the real client 198.51.100.7.
    expect(forwardedClient('1.2.3.4, 198.51.100.7', '10.0.0.2', 1)).toBe('198.51.100.7')
  })

  it('with two trusted proxies takes the second entry from the right', () => {
    // Client 198.51.100.7 -> proxy A (appends the client) -> proxy B (appends A, 10.0.0.9) -> us.
    expect(forwardedClient('6.6.6.6, 198.51.100.7, 10.0.0.9', '10.0.0.3', 2)).toBe('198.51.100.7')
  })

  it('joins repeated headers in order and trims blanks', () => {
    expect(forwardedClient(['1.2.3.4', ' 198.51.100.8 '], '10.0.0.2', 1)).toBe('198.51.100.8')
  })

  it('falls back to the socket address without a header, and to the leftmost entry when fewer entries than proxies', () => {
    expect(forwardedClient(undefined, '10.0.0.2', 1)).toBe('10.0.0.2')
    expect(forwardedClient('198.51.100.9', '10.0.0.2', 3)).toBe('198.51.100.9')
  })
})
