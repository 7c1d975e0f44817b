import { describe, expect, it } from "vitest";
import { clientAddress, PEER_HEADER } from "@/lib/auth/rate-limit";

// RFC 7239 §5.2 and the X-Forwarded-For convention: each proxy appends the address it received the
// request from, so only the rightmost entries written by proxies one trusts are worth anything.
describe("clientAddress", () => {
  const h = (xff: string | null, peer = "10.0.0.2") => new Headers({ ...(xff === null ? {} : { "x-forwarded-for": xff }), [PEER_HEADER]: peer });

  it("ignores X-Forwarded-For with no trusted proxy: a client cannot choose its address", () => {
    expect(clientAddress(h("1.2.3.4"), 0)).toBe("10.0.0.2");
    expect(clientAddress(h("1.2.3.4, 5.6.7.8"), 0)).toBe("10.0.0.2");
  });

  it("takes the address the trusted proxies saw, not what the client wrote before them", () => {
    // client 198.51.100.9 forged "1.2.3.4"; proxy A (203.0.113.5) appended the client; proxy B appended A; B is the peer
    expect(clientAddress(h("1.2.3.4, 198.51.100.9, 203.0.113.5", "10.0.0.2"), 2)).toBe("198.51.100.9");
    expect(clientAddress(h("1.2.3.4, 198.51.100.9", "203.0.113.5"), 1)).toBe("198.51.100.9");
  });

  it("falls back to the leftmost known address when the chain is shorter than the hops, and to 'unknown' without a peer", () => {
    expect(clientAddress(h(null, "198.51.100.9"), 3)).toBe("198.51.100.9");
    expect(clientAddress(new Headers(), 0)).toBe("unknown");
  });
});
