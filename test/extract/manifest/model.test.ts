import { describe, expect, it } from "vitest";
import { requestedPermissionNames } from "../../../src/extract/manifest/model.js";
import { readManifestBytes } from "../../../src/extract/read.js";

const manifest = (body: string) =>
  readManifestBytes(new TextEncoder().encode(`<manifest xmlns:android="http://schemas.android.com/apk/res/android" xmlns:tools="http://schemas.android.com/tools" package="org.example.model">${body}<application/></manifest>`), "AndroidManifest.xml");

describe("the requested permissions of a manifest", () => {
  it("are distinct and sorted, from every form of request", () => {
    const m = manifest(`<uses-permission android:name="android.permission.INTERNET"/><uses-permission-sdk-23 android:name="android.permission.CAMERA"/><uses-permission android:name="android.permission.INTERNET"/>`);
    expect(requestedPermissionNames(m)).toEqual(["android.permission.CAMERA", "android.permission.INTERNET"]);
  });

  it("leave out a request removed with tools:node=\"remove\" (the manifest merger drops it)", () => {
    const m = manifest(`<uses-permission android:name="android.permission.READ_PHONE_STATE" tools:node="remove"/><uses-permission android:name="android.permission.INTERNET"/>`);
    expect(requestedPermissionNames(m)).toEqual(["android.permission.INTERNET"]);
  });

  it("follow a change to the manifest's list, and hand out a copy", () => {
    const m = manifest(`<uses-permission android:name="android.permission.INTERNET"/>`);
    const first = requestedPermissionNames(m);
    first.push("changed by the caller");
    m.usesPermissions.push({ ...m.usesPermissions[0], name: "android.permission.CAMERA" });
    expect(requestedPermissionNames(m)).toEqual(["android.permission.CAMERA", "android.permission.INTERNET"]);
  });
});
