#!/usr/bin/env bash
# Release builds of steamcell: one static binary (CGO_ENABLED=0, -trimpath)
# per platform, stamped with the version and the commit (steamcell version
# shows both), and a SHA256SUMS file beside them. The Containerfile builds
# its binary with this script too, so the flags live here only.
#
#   bash server/deploy/release.sh                        # all platforms, into server/deploy/dist
#   VERSION=1.2.0 OUT=/tmp/release bash server/deploy/release.sh
#   TARGETS=linux/arm64 bash server/deploy/release.sh    # one platform
set -euo pipefail
cd "$(dirname "$0")/../.."

: "${TARGETS:=linux/amd64 linux/arm64 windows/amd64 darwin/arm64}"
: "${VERSION:=$(git describe --tags --dirty 2>/dev/null || echo 0.1.0-dev)}"
: "${COMMIT:=$(git rev-parse --short=12 HEAD 2>/dev/null || echo unknown)}"
: "${OUT:=server/deploy/dist}"

case "$VERSION$COMMIT" in
*[!A-Za-z0-9._+-]*) echo "release.sh: VERSION and COMMIT take letters, digits and . _ + - only" >&2; exit 2 ;;
esac

mkdir -p "$OUT"
ldflags="-s -w -X main.Version=$VERSION -X main.Commit=$COMMIT"
names=()
for target in $TARGETS; do
	os=${target%/*}
	arch=${target#*/}
	name="steamcell-$VERSION-$os-$arch"
	if [ "$os" = windows ]; then name="$name.exe"; fi
	echo "release.sh: $name"
	CGO_ENABLED=0 GOOS=$os GOARCH=$arch go build -trimpath -buildvcs=false -ldflags "$ldflags" -o "$OUT/$name" ./cmd/steamcell
	names+=("$name")
done

# sha256sum on Linux, shasum on macOS; both write the same format.
sum=(sha256sum)
command -v sha256sum >/dev/null || sum=(shasum -a 256)
(cd "$OUT" && "${sum[@]}" "${names[@]}" >SHA256SUMS)
echo "release.sh: $OUT/SHA256SUMS"
