// The sign-in delay policy. Common practice (OWASP Authentication Cheat
// Sheet, "Login Throttling": increasing delays rather than account lock-out);
// the figures themselves are ours and documented in the README.
import { describe, expect, it } from 'vitest'
import { bucketKeys, delayAfter, SIGN_IN_LIMITS } from '../../../server/services/sign-in-limits'

describe('sign-in delays', () => {
  it('double after each try past the free ones, from a quarter second up to the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 20].map(k => delayAfter(k))).toEqual([250, 500, 1000, 2000, 4000, 4000, 4000])
  })

  it('never make one steady guesser enough to keep the right person out: the longest pause is shorter than the longest wait', () => {
    // A try whose turn is further away than MAX_WAIT_MS is refused unchecked; one pause alone must never reach that far.
    expect(delayAfter(1000)).toBeLessThan(SIGN_IN_LIMITS.MAX_WAIT_MS)
  })

  it('keeps the account and the address in separate buckets, so an e-mail cannot pose as an address', () => {
    const [account, address] = bucketKeys('198.51.100.1', '198.51.100.1')
    expect(account).not.toBe(address)
  })
})
