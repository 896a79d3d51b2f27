import { describe, expect, it } from "vitest";
import { listenHost } from "@/scripts/stack";

describe("the interface the demo and the browser tests' app listen on", () => {
  it("is 127.0.0.1 unless LOAMWORK_HOST says otherwise", () => {
    expect(listenHost({})).toBe("127.0.0.1");
    expect(listenHost({ LOAMWORK_HOST: "" })).toBe("127.0.0.1");
    expect(listenHost({ LOAMWORK_HOST: "  " })).toBe("127.0.0.1");
    expect(listenHost({ LOAMWORK_HOST: "0.0.0.0" })).toBe("0.0.0.0");
    expect(listenHost({ LOAMWORK_HOST: "trench-laptop.local" })).toBe("trench-laptop.local");
    expect(listenHost({ LOAMWORK_HOST: "::" })).toBe("::");
  });

  it("refuses a value that is not a host name or address", () => {
    expect(() => listenHost({ LOAMWORK_HOST: "0.0.0.0 --inspect" })).toThrow(/LOAMWORK_HOST/);
  });
});
