#!/usr/bin/env bash
# Compiles the invented demo manifests in fixtures/apps/ into real APKs with the Android toolchain
# (Debian's aapt/aapt2, linked against android-framework-res's framework-res.apk, API 29), and writes
# the toolchain's own dumps of them next to them. The APKs and dumps are committed, so tests run without
# the toolchain; rerun this script after changing a demo manifest.
#
#   apt-get install -y aapt android-framework-res
#   npm run fixtures
set -euo pipefail
cd "$(dirname "$0")/.."
FRAMEWORK=${FRAMEWORK:-/usr/share/android-framework-res/framework-res.apk}
APPS=fixtures/apps
APK=fixtures/apk
DUMPS=fixtures/dumps
WORK=$(mktemp -d)
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$APK" "$DUMPS" fixtures/platform

for tool in aapt aapt2; do command -v $tool >/dev/null || { echo "needs $tool (apt-get install aapt)" >&2; exit 1; }; done
[ -f "$FRAMEWORK" ] || { echo "needs $FRAMEWORK (apt-get install android-framework-res)" >&2; exit 1; }

# aapt2: compile resources, then link. Extra link flags per variant.
build2() { # name variant [link flags...]
  local name=$1 variant=$2; shift 2
  local out="$APK/$variant.apk"
  rm -rf "$WORK/$variant" && mkdir -p "$WORK/$variant"
  aapt2 compile --dir "$APPS/$name/res" -o "$WORK/$variant/res.zip"
  aapt2 link -I "$FRAMEWORK" --manifest "$APPS/$name/AndroidManifest.xml" -o "$out" "$@" "$WORK/$variant/res.zip"
}
# aapt (the older packager): needs the manifest to be called AndroidManifest.xml.
build1() { # name variant [package flags...]
  local name=$1 variant=$2; shift 2
  aapt package -f "$@" -M "$APPS/$name/AndroidManifest.xml" -S "$APPS/$name/res" -I "$FRAMEWORK" -F "$APK/$variant.apk"
}

build2 tidewatch tidewatch
# Neither packager here stores AndroidManifest.xml uncompressed (both deflate it whatever -0 says), so the
# stored variant re-packs the toolchain's entries, byte for byte, with every entry stored.
python3 - "$APK/tidewatch.apk" "$APK/tidewatch-stored.apk" <<'PY'
import sys, zipfile
with zipfile.ZipFile(sys.argv[1]) as src, zipfile.ZipFile(sys.argv[2], "w", zipfile.ZIP_STORED) as dst:
    for info in src.infolist():
        data = src.read(info.filename)
        copy = zipfile.ZipInfo(info.filename, date_time=info.date_time)
        copy.compress_type = zipfile.ZIP_STORED
        dst.writestr(copy, data)
PY
build2 pocketlamp pocketlamp
build2 chirpchat chirpchat --warn-manifest-validation
build1 flashdeck flashdeck
build2 townsquare townsquare
build2 townsquare townsquare-nons --no-xml-namespaces
build2 snapshare snapshare
build2 tidewatch-next tidewatch-next
build2 beamtorch beamtorch

# Modern apps (targets 34-35, typed foreground services, Health Connect, self-managed calls): aapt2 knows
# only the service-type flags of the framework it links against (API 29), so each is linked with its types
# set to dataSync and the real flags are written into the binary manifest afterwards.
for name in stridecoach lumenedit harbourtalk quillnote quillnote-test snapqr echomemo; do
  sed -E 's/android:foregroundServiceType="[^"]*"/android:foregroundServiceType="dataSync"/' "$APPS/$name/AndroidManifest.xml" > "$WORK/$name-AndroidManifest.xml"
  aapt2 link -I "$FRAMEWORK" --manifest "$WORK/$name-AndroidManifest.xml" -o "$WORK/$name.apk"
  node scripts/patch-service-types.mjs "$APPS/$name/AndroidManifest.xml" "$WORK/$name.apk" "$APK/$name.apk"
done

# App bundle layout and multi-APK archive, from the same demo manifests.
mkdir -p fixtures/bundle
aapt2 compile --dir "$APPS/tidewatch/res" -o "$WORK/tw-res.zip"
aapt2 link --proto-format -I "$FRAMEWORK" --manifest "$APPS/tidewatch/AndroidManifest.xml" -o "$WORK/tidewatch-proto.zip" "$WORK/tw-res.zip"
aapt2 link --proto-format -I "$FRAMEWORK" --manifest "$APPS/tidewatch-ar/AndroidManifest.xml" -o "$WORK/tidewatch-ar-proto.zip"
aapt2 link -I "$FRAMEWORK" --manifest "$APPS/tidewatch-ar/AndroidManifest.xml" -o "$WORK/tidewatch-ar.apk"
# The toolchain's own conversion of the proto build back to binary: the same manifest in both forms.
aapt2 convert --output-format binary -o fixtures/bundle/tidewatch-from-proto.apk "$WORK/tidewatch-proto.zip"
python3 - "$WORK" fixtures/bundle "$APK/tidewatch.apk" <<'PY'
import sys, zipfile
work, out, base_apk = sys.argv[1:4]
def copy(src, dst, prefix, rename):
    with zipfile.ZipFile(src) as z:
        for info in z.infolist():
            dst.writestr(zipfile.ZipInfo(prefix + rename.get(info.filename, info.filename), date_time=(1980, 1, 1, 0, 0, 0)), z.read(info.filename), zipfile.ZIP_DEFLATED)
# An app bundle: <module>/manifest/AndroidManifest.xml (protobuf), <module>/resources.pb, <module>/res/...
with zipfile.ZipFile(f"{out}/tidewatch.aab", "w") as aab:
    copy(f"{work}/tidewatch-proto.zip", aab, "base/", {"AndroidManifest.xml": "manifest/AndroidManifest.xml"})
    copy(f"{work}/tidewatch-ar-proto.zip", aab, "tide_ar/", {"AndroidManifest.xml": "manifest/AndroidManifest.xml"})
# A multi-APK archive as commonly exchanged: the base APK and a split APK side by side.
with zipfile.ZipFile(f"{out}/tidewatch-splits.apks", "w") as apks:
    apks.write(base_apk, "base.apk", zipfile.ZIP_STORED)
    apks.write(f"{work}/tidewatch-ar.apk", "split_tide_ar.apk", zipfile.ZIP_STORED)
PY
# The proto build as it comes out of aapt2: an APK-shaped zip whose manifest is protobuf XML.
cp "$WORK/tidewatch-proto.zip" fixtures/bundle/tidewatch-proto.apk
unzip -o -q -d "$WORK/twp" "$WORK/tidewatch-proto.zip" AndroidManifest.xml
cp "$WORK/twp/AndroidManifest.xml" fixtures/bundle/tidewatch-proto-AndroidManifest.pb
aapt dump permissions "$WORK/tidewatch-ar.apk" > "$DUMPS/tidewatch-ar.permissions.txt"
aapt dump xmltree fixtures/bundle/tidewatch-from-proto.apk AndroidManifest.xml > "$DUMPS/tidewatch-from-proto.xmltree.txt"

# Dex code of the demo torch (fixtures/smali, assembled by Debian's smali) and dexdump's listing of it,
# which test/extract/dex/dex.test.ts compares the dex reader with.
if command -v smali >/dev/null && command -v dexdump >/dev/null; then
  mkdir -p fixtures/dex
  for part in classes classes2; do
    smali assemble -o "fixtures/dex/beamtorch-$part.dex" "fixtures/smali/beamtorch/$part/"
    dexdump -d "fixtures/dex/beamtorch-$part.dex" > "$DUMPS/beamtorch-$part.dexdump.txt"
  done
  # The torch with its code: a multidex APK (classes.dex + classes2.dex added to aapt2's output with aapt add).
  rm -rf "$WORK/code" && mkdir -p "$WORK/code"
  cp "$APK/beamtorch.apk" "$WORK/code/beamtorch-code.apk"
  cp fixtures/dex/beamtorch-classes.dex "$WORK/code/classes.dex"
  cp fixtures/dex/beamtorch-classes2.dex "$WORK/code/classes2.dex"
  (cd "$WORK/code" && aapt add -v beamtorch-code.apk classes.dex classes2.dex >/dev/null)
  cp "$WORK/code/beamtorch-code.apk" "$APK/beamtorch-code.apk"
  # Apps whose code exercises the call graph (fixtures/smali/<app>/classes*/): assembled, dumped, added to the APK.
  for app in echomemo callgraph; do
    [ -d "fixtures/smali/$app" ] || continue
    rm -rf "$WORK/code-$app" && mkdir -p "$WORK/code-$app"
    [ -f "$APK/$app.apk" ] && cp "$APK/$app.apk" "$WORK/code-$app/$app.apk"
    parts=()
    for dir in fixtures/smali/$app/classes*/; do
      part=$(basename "$dir")
      smali assemble -o "fixtures/dex/$app-$part.dex" "$dir"
      dexdump -d "fixtures/dex/$app-$part.dex" > "$DUMPS/$app-$part.dexdump.txt"
      cp "fixtures/dex/$app-$part.dex" "$WORK/code-$app/$part.dex"
      parts+=("$part.dex")
    done
    if [ -f "$WORK/code-$app/$app.apk" ]; then
      (cd "$WORK/code-$app" && aapt add -v "$app.apk" "${parts[@]}" >/dev/null)
      cp "$WORK/code-$app/$app.apk" "$APK/$app.apk"
    fi
  done
fi

for f in "$APK"/*.apk; do
  v=$(basename "$f" .apk)
  aapt dump permissions "$f" > "$DUMPS/$v.permissions.txt"
  aapt dump xmltree "$f" AndroidManifest.xml > "$DUMPS/$v.xmltree.txt"
  aapt dump badging "$f" > "$DUMPS/$v.badging.txt" 2>/dev/null || true
  unzip -v "$f" > "$DUMPS/$v.entries.txt"
done
# The multidex torch rewritten as a zip64 archive by Info-ZIP's zip (-fz: zip64 end records and extra
# fields); Debian's aapt refuses zip64, so it lives apart from fixtures/apk and its dumps.
rm -rf "$WORK/z64" && mkdir -p "$WORK/z64" && unzip -q "$APK/beamtorch-code.apk" -d "$WORK/z64/src"
(cd "$WORK/z64/src" && zip -q -X -fz -r ../out.apk .)
cp "$WORK/z64/out.apk" fixtures/zip64/beamtorch-code-zip64.apk

# A res/xml file compiled with a UTF-8 string pool, as the toolchain writes those.
aapt dump xmltree "$APK/tidewatch.apk" res/xml/network_security_config.xml > "$DUMPS/tidewatch.network_security_config.xmltree.txt"


# The platform's own binary manifest (API 29), and aapt's dump of it.
unzip -o -q -d "$WORK/fw" "$FRAMEWORK" AndroidManifest.xml
cp "$WORK/fw/AndroidManifest.xml" fixtures/platform/framework-res-AndroidManifest.xml
aapt dump xmltree "$FRAMEWORK" AndroidManifest.xml > fixtures/platform/framework-res-AndroidManifest.xmltree.txt

# Tables generated from the same platform file.
node scripts/gen-android-attributes.mjs "$FRAMEWORK"
echo "fixtures rebuilt with: $(aapt version 2>&1 | head -1); $(aapt2 version 2>&1 | head -1)"
