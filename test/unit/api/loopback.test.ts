// The loopback rule: which header combinations count as a caller on this machine. Addresses follow
// RFC 1122 §3.2.1.3 (127.0.0.0/8 is loopback) and RFC 4291 §2.5.3 (::1), with IPv4-mapped forms
// (RFC 4291 §2.5.5.2) as Node reports them for dual-stack sockets.
import { describe, expect, test } from "vitest";
import { isLoopbackAddress, isLoopbackHost, loopbackRefusal } from "@/src/api/loopback";

describe("isLoopbackAddress", () => {
  test.each(["127.0.0.1", "127.255.0.9", "::1", "[::1]", "::ffff:127.0.0.1", "0:0:0:0:0:0:0:1"])("%s is loopback", (address) => {
    expect(isLoopbackAddress(address)).toBe(true);
  });
  test.each(["10.0.0.1", "128.0.0.1", "127.0.0.256", "127.0.0", "::2", "::ffff:10.0.0.1", "localhost", "", "127.0.0.1.evil"])(
    "%s is not loopback",
    (address) => {
      expect(isLoopbackAddress(address)).toBe(false);
    },
  );
});

describe("isLoopbackHost", () => {
  test.each(["localhost", "localhost:3000", "127.0.0.1:3123", "[::1]:3000", "[::1]", "LOCALHOST"])("%s names this machine", (host) => {
    expect(isLoopbackHost(host)).toBe(true);
  });
  test.each(["plant.example", "10.1.2.3:3000", "localhost.example:80", "[::2]:3000"])("%s does not", (host) => {
    expect(isLoopbackHost(host)).toBe(false);
  });
});

describe("loopbackRefusal", () => {
  const local = { "x-forwarded-for": "127.0.0.1", host: "localhost:3000" };
  test("a direct local caller is accepted", () => {
    expect(loopbackRefusal(new Headers(local))).toBeUndefined();
    expect(loopbackRefusal(new Headers({ "x-forwarded-for": "::ffff:127.0.0.1", host: "127.0.0.1:3123" }))).toBeUndefined();
  });
  test.each([
    ["no address at all", { host: "localhost" }, "the caller's address is unknown"],
    ["a remote address", { ...local, "x-forwarded-for": "192.168.1.20" }, "the caller 192.168.1.20 is not on this machine"],
    ["a proxy chain", { ...local, "x-forwarded-for": "203.0.113.5, 127.0.0.1" }, "the caller 203.0.113.5, 127.0.0.1 is not on this machine"],
    ["a remote x-real-ip", { ...local, "x-real-ip": "203.0.113.5" }, "the caller 203.0.113.5 is not on this machine"],
    ["a remote Forwarded", { ...local, forwarded: 'for="[2001:db8::1]:4711"' }, 'the caller for="[2001:db8::1]:4711" is not on this machine'],
    ["a Forwarded without for=", { ...local, forwarded: "proto=https" }, "the caller proto=https is not on this machine"],
    ["another host name (DNS rebinding)", { ...local, host: "attacker.example" }, "the host name attacker.example is not this machine"],
    ["no host", { "x-forwarded-for": "127.0.0.1" }, "the host name (none) is not this machine"],
  ])("%s is refused", (_label, headers, reason) => {
    expect(loopbackRefusal(new Headers(headers))).toBe(reason);
  });
  test("a local proxy naming a local client is accepted", () => {
    expect(loopbackRefusal(new Headers({ ...local, "x-real-ip": "127.0.0.1", forwarded: "for=127.0.0.1;proto=http" }))).toBeUndefined();
  });
});
