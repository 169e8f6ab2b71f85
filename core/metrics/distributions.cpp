#include "metrics/distributions.hpp"

#include <boost/math/distributions/beta.hpp>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include <cmath>

namespace plumbline {

double normalQuantile(double p)
{
    return boost::math::quantile(boost::math::normal_distribution<>(), p);
}

double normalCdf(double z)
{
    return boost::math::cdf(boost::math::normal_distribution<>(), z);
}

double twoSidedNormalP(double z)
{
    return 2.0 * boost::math::cdf(boost::math::complement(boost::math::normal_distribution<>(), std::abs(z)));
}

double chiSquaredUpperTail(double x, double df)
{
    return boost::math::cdf(boost::math::complement(boost::math::chi_squared_distribution<>(df), std::max(0.0, x)));
}

double chiSquaredQuantile(double p, double df)
{
    return boost::math::quantile(boost::math::chi_squared_distribution<>(df), p);
}

double betaQuantile(double a, double b, double p)
{
    return boost::math::quantile(boost::math::beta_distribution<>(a, b), p);
}

double studentTQuantile(double p, double df)
{
    return boost::math::quantile(boost::math::students_t_distribution<>(df), p);
}

double zForConfidence(double confidence)
{
    return normalQuantile(0.5 + confidence / 2.0);
}

} // namespace plumbline
