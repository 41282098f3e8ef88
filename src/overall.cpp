#include "contrasta/overall.hpp"

namespace contrasta {

std::vector<overall_test> overall_tests(const prepared_data& p) {
  std::vector<overall_test> out;
  if (p.anova.df_between > 0 && p.anova.df_within > 0) {
    overall_test t;
    t.test = "anova-f";
    t.statistic = p.anova.f;
    t.df1 = p.anova.df_between;
    t.df2 = p.anova.df_within;
    t.p_value = p.anova.p_value;
    t.null_hypothesis = "all level means are equal (normal errors, common variance)";
    out.push_back(t);
  }
  return out;
}

}  // namespace contrasta
