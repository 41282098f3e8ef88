// Overall (omnibus) tests of equal level means or distributions.
#pragma once
#include <optional>
#include <string>
#include <vector>

#include "contrasta/prepared.hpp"

namespace contrasta {

struct overall_test {
  std::string test;  // anova-f | welch-f | brown-forsythe-f | alexander-govern | kruskal-wallis
  double statistic = 0;
  double df1 = 0;
  std::optional<double> df2;  // absent for chi-square tests
  double p_value = 0;
  std::string null_hypothesis;  // words
};

// Classical one-way ANOVA F(k-1, N-k), from the prepared ANOVA table.
overall_test anova_f_test(const prepared_data& p);
// Welch's heteroscedastic F (Welch 1951, Biometrika 38:330-336).
overall_test welch_f_test(const prepared_data& p);
// Brown-Forsythe F* for means (Brown & Forsythe 1974, Technometrics 16:129-132), df1 = k - 1.
overall_test brown_forsythe_f_test(const prepared_data& p);
// Alexander-Govern chi-square (Alexander & Govern 1994, J. Educ. Stat. 19:91-101).
overall_test alexander_govern_test(const prepared_data& p);
// Kruskal-Wallis H with the tie correction (Kruskal & Wallis 1952, JASA 47:583-621).
overall_test kruskal_wallis_test(const prepared_data& p);

// Every overall test that the data allow, in a fixed order: anova-f, welch-f, brown-forsythe-f,
// alexander-govern, kruskal-wallis. The heteroscedastic tests need n >= 2 and a positive
// variance in every level.
std::vector<overall_test> overall_tests(const prepared_data& p);

}  // namespace contrasta
