// The do-nothing program that heatdeck's start-up is compared with
// (tools/bench.sh, target P2): a C++ executable that starts and exits.
int main() { return 0; }
