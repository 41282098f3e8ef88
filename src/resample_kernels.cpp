// Picks the resampling kernels for the processor at run time. The levels compute identical
// numbers (resample_kernels.hpp), so the choice changes speed only.
#include "resample_kernels.hpp"

namespace contrasta::detail {
namespace kernel_levels {
#if defined(CONTRASTA_KERNELS_X86_64)
namespace x86_64_v4 {
extern const resample_kernels kernels;
}
namespace x86_64_v3 {
extern const resample_kernels kernels;
}
#endif
namespace portable {
extern const resample_kernels kernels;
}
}  // namespace kernel_levels

std::size_t available_kernels(const resample_kernels** out) {
  std::size_t k = 0;
#if defined(CONTRASTA_KERNELS_X86_64)
  __builtin_cpu_init();
  if (__builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq") && __builtin_cpu_supports("avx512vl") &&
      __builtin_cpu_supports("avx512bw") && __builtin_cpu_supports("avx512cd") && __builtin_cpu_supports("avx2") &&
      __builtin_cpu_supports("fma") && __builtin_cpu_supports("bmi2"))
    out[k++] = &kernel_levels::x86_64_v4::kernels;
  if (__builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma") && __builtin_cpu_supports("bmi") &&
      __builtin_cpu_supports("bmi2") && __builtin_cpu_supports("popcnt"))
    out[k++] = &kernel_levels::x86_64_v3::kernels;
#endif
  out[k++] = &kernel_levels::portable::kernels;
  return k;
}

const resample_kernels& best_kernels() {
  static const resample_kernels* const best = [] {
    const resample_kernels* all[4];
    available_kernels(all);
    return all[0];
  }();
  return *best;
}

}  // namespace contrasta::detail
