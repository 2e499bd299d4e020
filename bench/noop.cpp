// The do-nothing program that heatdeck's start-up is compared with
// (tools/bench.sh, target P2): a C++ executable that starts and exits.
//
// It flushes std::cout and nothing more.  Without any use of the standard
// library the linker (--as-needed) drops libstdc++, leaving a program that
// loads only libc, which is a C program in all but name.  Touching std::cout
// makes it load and initialise the C++ runtime (libstdc++, libm, libgcc_s and
// the iostreams), as every ordinary C++ program built this way does.
#include <iostream>

int main() {
  std::cout.flush();
  return 0;
}
