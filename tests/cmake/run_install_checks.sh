#!/bin/sh
# Install checks: install the build into a temporary prefix, then
#  1. every exported symbol of the shared library starts with ascr_;
#  2. every public header compiles on its own, as C17 and as C++;
#  3. a consumer program builds against the installed library through the CMake package and
#     through pkg-config, and runs;
#  4. the example blade_performance (blade file -> tables -> points) builds and runs.
# usage: run_install_checks.sh BUILD_DIR SOURCE_DIR
set -eu
build=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
prefix=$tmp/prefix
cmake --install "$build" --prefix "$prefix" > "$tmp/install.log"
libdir=$(ls -d "$prefix"/lib* | head -n 1)
fail=0; pass=0

bad=$(nm -D --defined-only "$libdir/libairscrew.so" | awk '$2 ~ /[TDBR]/ {print $3}' | grep -v '^ascr_' | grep -v -E '^(_init|_fini|_edata|_end|__bss_start)$' || true)
if [ -n "$bad" ]; then echo "FAIL: exported symbols without the ascr_ prefix:"; echo "$bad"; fail=$((fail+1)); else pass=$((pass+1)); fi

for h in "$prefix"/include/airscrew/*.h; do
  printf '#include <airscrew/%s>\nint ascr_header_check;\n' "$(basename "$h")" > "$tmp/h.c"
  if ! cc -std=c17 -Wall -Wextra -Wpedantic -Werror -fsyntax-only -I"$prefix/include" -x c "$tmp/h.c"; then
    echo "FAIL: $h does not compile alone as C"; fail=$((fail+1)); else pass=$((pass+1)); fi
  if command -v c++ > /dev/null; then
    if ! c++ -Wall -Wextra -Werror -fsyntax-only -I"$prefix/include" -x c++ "$tmp/h.c"; then
      echo "FAIL: $h does not compile as C++"; fail=$((fail+1)); else pass=$((pass+1)); fi
  fi
done

cmake -S "$src/tests/cmake/consumer" -B "$tmp/cbuild" -DCMAKE_PREFIX_PATH="$prefix" > "$tmp/c.log" 2>&1 \
  && cmake --build "$tmp/cbuild" >> "$tmp/c.log" 2>&1 \
  && LD_LIBRARY_PATH="$libdir" "$tmp/cbuild/consumer" \
  && pass=$((pass+1)) || { echo "FAIL: CMake consumer"; cat "$tmp/c.log"; fail=$((fail+1)); }

# blade file to performance through the library's table pipeline (a polar-table file for the
# section, so that nothing is computed here)
LD_LIBRARY_PATH="$libdir" "$tmp/cbuild/blade_performance" "$src/tests/data/blades/two-blade-4412.json" 6000 \
    "main=$src/tests/data/naca4412-table.json" \
  && pass=$((pass+1)) || { echo "FAIL: blade_performance example"; fail=$((fail+1)); }

PKG_CONFIG_PATH="$libdir/pkgconfig" cc -std=c17 -o "$tmp/pkgc" "$src/tests/cmake/consumer/main.c" \
  $(PKG_CONFIG_PATH="$libdir/pkgconfig" pkg-config --cflags --libs airscrew) -lgsl \
  && LD_LIBRARY_PATH="$libdir" "$tmp/pkgc" \
  && pass=$((pass+1)) || { echo "FAIL: pkg-config consumer"; fail=$((fail+1)); }

echo "$pass passed, $fail failed"
[ $fail = 0 ]
