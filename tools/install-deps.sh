#!/usr/bin/env bash
# Installs the Debian packages heatdeck needs, skipping those already there.
#   tools/install-deps.sh          build and run
#   tools/install-deps.sh --test   also what the test suite needs
#   tools/install-deps.sh --bench  also what tools/bench.sh needs
set -euo pipefail

pkgs=(build-essential cmake pkg-config libpugixml-dev libxlsxwriter-dev
      libcli11-dev libfmt-dev nlohmann-json3-dev nettle-dev)
if [[ "${1:-}" == "--test" ]]; then
  pkgs+=(libgtest-dev libgmock-dev python3 libreoffice-calc-nogui)
fi
if [[ "${1:-}" == "--bench" ]]; then
  pkgs+=(libbenchmark-dev time)
fi

missing=()
for p in "${pkgs[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]} == 0)); then
  exit 0
fi
echo "heatdeck: installing ${missing[*]}" >&2
sudo=""
if [[ $(id -u) -ne 0 ]]; then sudo="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
$sudo apt-get update -qq
$sudo apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
