#!/usr/bin/env bash
# Installs the C toolchains the code-generator verification tests use:
#   host gcc and clang (compile + run every ADC code, with the sanitizers), avr-gcc + avr-libc + simavr (8-bit size and cycles),
#   arm-none-eabi-gcc + newlib (Cortex-M0 size).
# Idempotent: skips apt entirely when every tool is already present. Needs root (CI runs as root).
set -euo pipefail

need=()
command -v gcc >/dev/null 2>&1 || need+=(gcc libc6-dev)
command -v clang >/dev/null 2>&1 || need+=(clang)
# clang's sanitizer run-time libraries (Debian ships them apart from clang).
ls /usr/lib/llvm-*/lib/clang/*/lib/linux/libclang_rt.asan-x86_64.a >/dev/null 2>&1 || need+=(libclang-rt-dev)
command -v avr-gcc >/dev/null 2>&1 || need+=(gcc-avr binutils-avr)
[ -f /usr/lib/avr/include/avr/pgmspace.h ] || need+=(avr-libc)
command -v simavr >/dev/null 2>&1 || need+=(simavr)
command -v arm-none-eabi-gcc >/dev/null 2>&1 || need+=(gcc-arm-none-eabi binutils-arm-none-eabi)
[ -d /usr/lib/arm-none-eabi/newlib ] || need+=(libnewlib-arm-none-eabi)

if [ ${#need[@]} -eq 0 ]; then
  echo "install-toolchains: all toolchains present"
  exit 0
fi

SUDO=""
if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
echo "install-toolchains: installing ${need[*]}"
$SUDO apt-get update -q
$SUDO apt-get install -y -q --no-install-recommends "${need[@]}"
echo "install-toolchains: done"
