/**
 * Res_value: the typed value of a compiled attribute (ResourceTypes.h). We keep the type and the raw
 * 32-bit data, and derive a display form the way `aapt dump xmltree` shows it where that is useful.
 */

// Res_value.dataType values (ResourceTypes.h; the numbers appear as "(type 0x10)" in aapt's dumps).
export const TYPE_NULL = 0x00;
export const TYPE_REFERENCE = 0x01;
export const TYPE_ATTRIBUTE = 0x02;
export const TYPE_STRING = 0x03;
export const TYPE_FLOAT = 0x04;
export const TYPE_DIMENSION = 0x05;
export const TYPE_FRACTION = 0x06;
export const TYPE_DYNAMIC_REFERENCE = 0x07;
export const TYPE_DYNAMIC_ATTRIBUTE = 0x08;
export const TYPE_INT_DEC = 0x10;
export const TYPE_INT_HEX = 0x11;
export const TYPE_INT_BOOLEAN = 0x12;
export const TYPE_INT_COLOR_ARGB8 = 0x1c;
export const TYPE_INT_COLOR_RGB8 = 0x1d;
export const TYPE_INT_COLOR_ARGB4 = 0x1e;
export const TYPE_INT_COLOR_RGB4 = 0x1f;

export type TypedValue =
  | { kind: "null" }
  | { kind: "string"; value: string }
  | { kind: "int"; value: number; hex: boolean }
  | { kind: "boolean"; value: boolean }
  | { kind: "reference"; id: number; dynamic: boolean }
  | { kind: "attribute"; id: number; dynamic: boolean }
  | { kind: "float"; value: number }
  | { kind: "dimension"; value: number; unit: string }
  | { kind: "fraction"; value: number; unit: "%" | "%p" }
  | { kind: "color"; argb: number; form: "argb8" | "rgb8" | "argb4" | "rgb4" }
  | { kind: "unknown"; type: number; data: number };

const DIMENSION_UNITS = ["px", "dp", "sp", "pt", "in", "mm"]; // TypedValue.COMPLEX_UNIT_* 0..5
const RADIX_SHIFTS = [0, 7, 15, 23]; // TypedValue.COMPLEX_RADIX_23p0, 16p7, 8p15, 0p23: fraction bits of the mantissa

/** Decodes a complex (dimension/fraction) value: 24-bit mantissa, 2-bit radix, 4-bit unit. */
function complexToFloat(data: number): number {
  const mantissa = (data & 0xffffff00) >> 8; // signed 24-bit, via the sign of the int32
  const radix = (data >> 4) & 0x3;
  return mantissa / 2 ** RADIX_SHIFTS[radix];
}

/** Builds the TypedValue for a Res_value's (dataType, data); `str` resolves string-pool indexes. */
export function typedValue(type: number, data: number, str: (i: number) => string | undefined): TypedValue {
  switch (type) {
    case TYPE_NULL:
      return { kind: "null" };
    case TYPE_STRING:
      return { kind: "string", value: str(data >>> 0) ?? "" };
    case TYPE_INT_DEC:
      return { kind: "int", value: data | 0, hex: false };
    case TYPE_INT_HEX:
      return { kind: "int", value: data | 0, hex: true };
    case TYPE_INT_BOOLEAN:
      return { kind: "boolean", value: data !== 0 };
    case TYPE_REFERENCE:
    case TYPE_DYNAMIC_REFERENCE:
      return { kind: "reference", id: data >>> 0, dynamic: type === TYPE_DYNAMIC_REFERENCE };
    case TYPE_ATTRIBUTE:
    case TYPE_DYNAMIC_ATTRIBUTE:
      return { kind: "attribute", id: data >>> 0, dynamic: type === TYPE_DYNAMIC_ATTRIBUTE };
    case TYPE_FLOAT: {
      const f = new DataView(new ArrayBuffer(4));
      f.setInt32(0, data, true);
      return { kind: "float", value: f.getFloat32(0, true) };
    }
    case TYPE_DIMENSION:
      return { kind: "dimension", value: complexToFloat(data), unit: DIMENSION_UNITS[data & 0xf] ?? `unit${data & 0xf}` };
    case TYPE_FRACTION:
      return { kind: "fraction", value: complexToFloat(data) * 100, unit: (data & 0xf) === 1 ? "%p" : "%" };
    case TYPE_INT_COLOR_ARGB8:
    case TYPE_INT_COLOR_RGB8:
    case TYPE_INT_COLOR_ARGB4:
    case TYPE_INT_COLOR_RGB4:
      return {
        kind: "color",
        argb: data >>> 0,
        form: ({ 0x1c: "argb8", 0x1d: "rgb8", 0x1e: "argb4", 0x1f: "rgb4" } as const)[type],
      };
    default:
      return { kind: "unknown", type, data: data >>> 0 };
  }
}

/** Formats a resource id the way Android tooling prints it: `@0x7f0a0001`. */
export function formatResourceId(id: number, sigil = "@"): string {
  return `${sigil}0x${(id >>> 0).toString(16).padStart(8, "0")}`;
}

/** A compact text form of a value, for display and for comparison with plain XML. */
export function valueToText(v: TypedValue): string {
  switch (v.kind) {
    case "null":
      return "";
    case "string":
      return v.value;
    case "int":
      return v.hex ? `0x${(v.value >>> 0).toString(16)}` : String(v.value);
    case "boolean":
      return v.value ? "true" : "false";
    case "reference":
      return formatResourceId(v.id, "@");
    case "attribute":
      return formatResourceId(v.id, "?");
    case "float":
      return String(v.value);
    case "dimension":
      return `${v.value}${v.unit}`;
    case "fraction":
      return `${v.value}${v.unit}`;
    case "color":
      return `#${v.argb.toString(16).padStart(8, "0")}`;
    case "unknown":
      return `(type 0x${v.type.toString(16)})0x${v.data.toString(16)}`;
  }
}
