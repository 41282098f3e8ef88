// The resampling kernels for the compiler's baseline for the target (no -march): runs anywhere.
// CMakeLists.txt gives this file its -march and -ffp-contract=off.
#define CONTRASTA_KERNEL_LEVEL portable
#include "body.hpp"
