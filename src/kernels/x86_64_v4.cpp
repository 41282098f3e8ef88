// The resampling kernels for AVX-512 (x86-64-v4: AVX512F/BW/CD/DQ/VL).
// CMakeLists.txt gives this file its -march and -ffp-contract=off.
#define CONTRASTA_KERNEL_LEVEL x86_64_v4
#include "body.hpp"
