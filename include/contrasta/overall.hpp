// Overall (omnibus) tests of equal level means or distributions.
#pragma once
#include <optional>
#include <string>
#include <vector>

#include "contrasta/prepared.hpp"

namespace contrasta {

struct overall_test {
  std::string test;            // anova-f | welch-f | brown-forsythe-f | alexander-govern | kruskal-wallis
  double statistic = 0;
  double df1 = 0;
  std::optional<double> df2;   // absent for chi-square tests
  double p_value = 0;
  std::string null_hypothesis; // words
};

// Every overall test that the data allow, in a fixed order.
std::vector<overall_test> overall_tests(const prepared_data& p);

}  // namespace contrasta
