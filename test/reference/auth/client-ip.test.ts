import { createRequire } from "node:module";
import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import { clientIp } from "@/server/auth/rate-limit";

// Reference: proxy-addr (npm), which Express's `trust proxy` uses. With a number n, Express trusts
// the first n hops, counting the socket's address as hop 0 and then X-Forwarded-For from the right.
// scripts/serve.mjs appends the socket's address to X-Forwarded-For, so clientIp reads the same
// hops from the one header.
type Request = { headers: { "x-forwarded-for"?: string }; socket: { remoteAddress: string } };
const proxyaddr = createRequire(import.meta.url)("proxy-addr") as (
  req: Request,
  trust: (address: string, hop: number) => boolean,
) => string;

/** The header as the server hands it on: what arrived, then the socket's address. */
const asServed = (forwarded: string | undefined, socket: string) => (forwarded ? `${forwarded}, ${socket}` : socket);

const address = fc.oneof(fc.ipV4(), fc.ipV6());
// What arrives in X-Forwarded-For: any addresses, with the spacing and empty entries clients send.
const forwarded = fc.option(
  fc
    .array(fc.tuple(address, fc.constantFrom(",", ", ", " , ", ",,")), { minLength: 1, maxLength: 6 })
    .map((entries) => entries.map(([a, sep], i) => (i === 0 ? a : `${sep}${a}`)).join("")),
  { nil: undefined },
);

describe("clientIp against proxy-addr", () => {
  test.prop([forwarded, address, fc.integer({ min: 0, max: 8 })], { numRuns: 500 })(
    "picks the same address for every list and every number of trusted proxies",
    (xff, socket, hops) => {
      const expected = proxyaddr(
        { headers: xff ? { "x-forwarded-for": xff } : {}, socket: { remoteAddress: socket } },
        (_, hop) => hop < hops,
      );
      expect(clientIp(new Headers({ "x-forwarded-for": asServed(xff, socket) }), hops)).toBe(expected);
    },
  );
});
