import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { jsonSyntaxProblem } from "../../src/licence/index.js";

function parses(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
}

describe("jsonSyntaxProblem(text)", () => {
  it("agrees with JSON.parse (the reference parser, RFC 8259) on which texts are JSON", () => {
    // Valid documents, then the same with one character deleted, replaced or inserted.
    const edits = fc.tuple(fc.json(), fc.nat(), fc.constantFrom("", "{", "}", "[", "]", ",", ":", '"', "\\", "0", "-", ".", "e", " ", "\n", "\u0001", "x"), fc.constantFrom(0, 1));
    fc.assert(fc.property(edits, ([text, at, c, drop]) => {
      const i = text.length === 0 ? 0 : at % text.length;
      const edited = text.slice(0, i) + c + text.slice(i + drop);
      expect(jsonSyntaxProblem(text)).toBeNull();
      expect(jsonSyntaxProblem(edited) === null).toBe(parses(edited));
    }), { numRuns: 3000, seed: 20240611 });
  });

  it("agrees with JSON.parse on the grammar's corners (trailing commas, leading zeros, bad escapes)", () => {
    const CORNERS = [
      "[1,]", '{"a":1,}', "[,1]", "[1 2]", '{"a" 1}', "{1:2}", '{"a":}', "01", "-0", "1.", ".5", "-", "1e", "1e+", "1E-2",
      '"\\x"', '"\\u12"', '"\\u12ab"', '"a', "tru", "nulll", "true false", " \t\r\n[] ", "\u00a0[]", "[]\u0000", '"\u0001"',
      "[[[[]]]]", '{"a":{"b":[1,{"c":null}]}}', "-01", "1.5e3", "[-]", '{"a":1 "b":2}',
    ];
    for (const text of CORNERS) expect(jsonSyntaxProblem(text) === null, text).toBe(parses(text));
  });

  it("gives the 1-based line and column of the first character that breaks the grammar", () => {
    expect(jsonSyntaxProblem('{\n  "a": 1,\n}')).toEqual({ line: 3, column: 1, expected: "a property name in double quotes" });
    expect(jsonSyntaxProblem("[1, 2")?.expected).toMatch(/the file ends here/);
    expect(jsonSyntaxProblem("01")).toMatchObject({ line: 1, column: 2 });
  });
});
