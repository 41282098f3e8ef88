// The project's one Boost.Math error policy and the distributions built on it. Domain, pole,
// overflow and evaluation errors return NaN / inf instead of throwing, so that a method on
// degenerate data yields NaN fields (reported as such) rather than an exception from deep inside
// a formula; float promotion is off because every caller works in double.
#pragma once
#include <boost/math/distributions/beta.hpp>
#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/non_central_t.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <boost/math/policies/policy.hpp>

namespace contrasta::detail {

using policy = boost::math::policies::policy<
    boost::math::policies::domain_error<boost::math::policies::errno_on_error>,
    boost::math::policies::pole_error<boost::math::policies::errno_on_error>,
    boost::math::policies::overflow_error<boost::math::policies::errno_on_error>,
    boost::math::policies::evaluation_error<boost::math::policies::errno_on_error>,
    boost::math::policies::rounding_error<boost::math::policies::errno_on_error>,
    boost::math::policies::promote_float<false>, boost::math::policies::promote_double<false>>;

using normal = boost::math::normal_distribution<double, policy>;
using students_t = boost::math::students_t_distribution<double, policy>;
using fisher_f = boost::math::fisher_f_distribution<double, policy>;
using chi_squared = boost::math::chi_squared_distribution<double, policy>;
using beta = boost::math::beta_distribution<double, policy>;
using binomial = boost::math::binomial_distribution<double, policy>;
using non_central_t = boost::math::non_central_t_distribution<double, policy>;

// Upper-tail probability P(T > t) for Student's t with df degrees of freedom; df = inf gives
// the normal tail. Computed directly (not 1 - cdf) so small p-values keep their digits.
double t_upper_tail(double t, double df);
// Quantile of Student's t: P(T <= q) = prob; df = inf gives the normal quantile.
double t_quantile(double prob, double df);
// p-value of a t (or z with df = inf) statistic for the alternative.
double t_p_value(double t, double df, int side);  // side: 0 two-sided, +1 greater, -1 less

}  // namespace contrasta::detail
