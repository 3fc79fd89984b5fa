/**
 * Reads the Android build's manifest-merger report (the "blame" report written beside the merged
 * manifest) to name the library that contributed each permission. The format, from memory of what the
 * Android Gradle plugin writes: a line naming the element (`uses-permission#android.permission.CAMERA`),
 * followed by indented lines `ADDED from [group:artifact:version] /path/AndroidManifest.xml:12:5-65` or
 * `ADDED from /path/src/main/AndroidManifest.xml:7:5-67` (the app's own manifest, no brackets), and
 * `MERGED from …` lines for further contributors.
 */

export interface PermissionOrigin {
  /** Library coordinates (`group:artifact:version`) that added or merged the permission. */
  libraries: string[];
  /** Whether the app's own manifest declares it. */
  app: boolean;
}

export function parseMergeReport(text: string): Map<string, PermissionOrigin> {
  const out = new Map<string, PermissionOrigin>();
  let current: PermissionOrigin | undefined;
  for (const line of text.split(/\r?\n/)) {
    const element = /^uses-permission(?:-sdk-23)?#(\S+)\s*$/.exec(line);
    if (element) {
      current = out.get(element[1]) ?? { libraries: [], app: false };
      out.set(element[1], current);
      continue;
    }
    const source = /^\s*(?:ADDED|MERGED|REJECTED|IMPLIED) from /.test(line);
    if (/^\S/.test(line) && !source) {
      current = undefined; // another element (or the manifest itself)
      continue;
    }
    const from = /^\s*(?:ADDED|MERGED) from (\[([^\]]+)\] )?(\S+)/.exec(line);
    if (!current || !from) continue;
    // Attribute sub-lines ("\tandroid:name" then deeper "ADDED from") repeat the element's sources.
    if (from[2]) {
      if (!current.libraries.includes(from[2])) current.libraries.push(from[2]);
    } else current.app = true;
  }
  return out;
}
