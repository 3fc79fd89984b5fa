import { readdirSync } from "node:fs";
import { fileURLToPath } from "node:url";

export const ROOT = fileURLToPath(new URL("../../", import.meta.url));
export const FIXTURES = `${ROOT}fixtures/`;
export const APK_DIR = `${FIXTURES}apk/`;
export const DUMP_DIR = `${FIXTURES}dumps/`;

/** Fixture APK variants, e.g. `tidewatch`, `tidewatch-stored`, `townsquare-nons`. */
export const APK_VARIANTS = readdirSync(APK_DIR).filter((f) => f.endsWith(".apk")).map((f) => f.slice(0, -4)).sort();

/** The demo app a variant was built from. */
export const appOf = (variant: string) => variant.replace(/-(stored|nons|code)$/, "");
