#!/usr/bin/env bash
# Installs the Debian packages the tests use, when missing: chromium (browser tests), FastJet (the reference
# library of the physics tests; never used at run time), HepMC3 (writes reference event files in that format) and
# redis-server (the scaled mode's queue, started by its integration tests and benchmark).
set -euo pipefail
need=()
[ -x /usr/bin/chromium ] || need+=(chromium)
[ -f /usr/include/fastjet/ClusterSequence.hh ] || need+=(libfastjet-dev)
[ -f /usr/include/fastjet/tools/Recluster.hh ] || need+=(libfastjettools-dev)
[ -f /usr/include/fastjet/EECambridgePlugin.hh ] || need+=(libfastjetplugins-dev)
[ -f /usr/include/nlohmann/json.hpp ] || need+=(nlohmann-json3-dev)
[ -f /usr/include/HepMC3/WriterAscii.h ] || need+=(libhepmc3-dev)
[ -x /usr/bin/redis-server ] || need+=(redis-server)
if [ ${#need[@]} -eq 0 ]; then echo "all present"; exit 0; fi
if [ "$(id -u)" -ne 0 ]; then
  echo "Missing Debian packages: ${need[*]}" >&2
  echo "Install them with: sudo apt-get install -y ${need[*]}" >&2
  exit 1
fi
echo "installing ${need[*]}"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq "${need[@]}" >/dev/null
