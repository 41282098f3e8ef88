// The resampling kernels for AVX2 and FMA (x86-64-v3).
// CMakeLists.txt gives this file its -march and -ffp-contract=off.
#define CONTRASTA_KERNEL_LEVEL x86_64_v3
#include "body.hpp"
