// Timings of the family-step distributions: studentized range cdf/sf and critical value,
// Dunnett's joint probability and critical value. Prints medians of repeated runs.
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <vector>

#include "contrasta/dunnett.hpp"
#include "contrasta/studentized_range.hpp"

namespace {
double median_ms(const std::function<void()>& f, int repeats) {
  std::vector<double> t;
  for (int i = 0; i < repeats; ++i) {
    auto a = std::chrono::steady_clock::now();
    f();
    auto b = std::chrono::steady_clock::now();
    t.push_back(std::chrono::duration<double, std::milli>(b - a).count());
  }
  std::nth_element(t.begin(), t.begin() + static_cast<long>(t.size() / 2), t.end());
  return t[t.size() / 2];
}
volatile double sink = 0;
}  // namespace

int main() {
  using namespace contrasta;
  const double inf = std::numeric_limits<double>::infinity();
  std::printf("studentized range sf (k=5, df=20, q=4.5): %.2f ms\n", median_ms([] { sink = studentized_range_sf(4.5, 5, 20); }, 15));
  std::printf("studentized range cdf (k=5, df=20, q=4.5): %.2f ms\n", median_ms([] { sink = studentized_range_cdf(4.5, 5, 20); }, 15));
  std::printf("studentized range sf (k=5, df=inf): %.3f ms\n", median_ms([&] { sink = studentized_range_sf(4.5, 5, inf); }, 15));
  std::printf("studentized range critical (alpha 0.05, k=5, df=20): %.1f ms\n", median_ms([] { sink = studentized_range_critical(0.05, 5, 20); }, 5));
  std::vector<double> lambda = dunnett_lambdas(std::vector<double>{5, 12, 20, 7}, 10);
  std::printf("Dunnett two-sided sf (m=4 unequal n, df=40): %.1f ms\n", median_ms([&] { sink = dunnett_sf(2.3, lambda, 40, true); }, 5));
  std::printf("Dunnett critical (m=4, df=40, two-sided): %.1f ms\n", median_ms([&] { sink = dunnett_critical(0.05, lambda, 40, true); }, 3));
  std::printf("Dunnett critical (m=4, df=inf, two-sided): %.2f ms\n", median_ms([&] { sink = dunnett_critical(0.05, lambda, inf, true); }, 5));
}
