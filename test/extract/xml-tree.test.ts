import { describe, expect, it } from "vitest";
import { adoptChild, type XmlElement } from "../../src/extract/xml-tree.js";

const el = (name: string): XmlElement => ({ name, attributes: [], children: [], path: "" });

describe("element paths", () => {
  it("number same-named siblings from 1, the first without a number", () => {
    const root = { ...el("manifest"), path: "/manifest" };
    const app = el("application");
    adoptChild(root, el("uses-permission"));
    adoptChild(root, el("uses-permission"));
    adoptChild(root, app);
    expect(root.children.map((c) => c.path)).toEqual(["/manifest/uses-permission", "/manifest/uses-permission[2]", "/manifest/application"]);
    adoptChild(app, el("activity"));
    expect(app.children[0].path).toBe("/manifest/application/activity");
  });

  it("count the same way past the scan threshold, as under the platform's own manifest", () => {
    // framework-res's <manifest> has thousands of <permission> children (fixtures/platform).
    const root = { ...el("manifest"), path: "/manifest" };
    for (let i = 0; i < 100; i++) {
      adoptChild(root, el("permission"));
      if (i % 10 === 0) adoptChild(root, el("protected-broadcast"));
    }
    expect(root.children.filter((c) => c.name === "permission").at(-1)!.path).toBe("/manifest/permission[100]");
    expect(root.children.filter((c) => c.name === "protected-broadcast").at(-1)!.path).toBe("/manifest/protected-broadcast[10]");
  });
});
