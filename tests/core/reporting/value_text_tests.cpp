#include "reporting/value_text.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

TEST_CASE("Numbers that round to zero print without a minus sign", "[text]")
{
    CHECK(fixedText(-1.4e-16, 3) == "0.000");
    CHECK(fixedText(-0.00004, 4) == "0.0000");
    CHECK(fixedText(-0.0004, 3) == "0.000");
    CHECK(fixedText(-0.0006, 3) == "-0.001");
    CHECK(fixedText(0.71949, 3) == "0.719");
    CHECK(fixedText(std::nullopt, 3) == "–");
}

TEST_CASE("p-values print one way everywhere", "[text]")
{
    CHECK(pValueText(0.3724) == "p = 0.372");
    CHECK(pValueText(0.0004) == "p < 0.001");
    CHECK(pValueText(0.001) == "p = 0.001");
    CHECK(pValueText(0.9996) == "p > 0.999");
}

TEST_CASE("Interval methods are named in words not in JSON keys", "[text]")
{
    CHECK(ciMethodLabel(CiMethod::BootstrapBca) == "bootstrap BCa");
    CHECK(ciMethodLabel(CiMethod::DeLongLogit) == "DeLong (logit scale)");
    CHECK(ciMethodLabel(CiMethod::ExactPoisson) == "exact Poisson");
    CHECK(bootstrapCiLabel(BootstrapCi::Percentile) == "bootstrap percentile");
    for (CiMethod m : {CiMethod::None, CiMethod::DeLongLogit, CiMethod::DeLongPlain, CiMethod::Wald, CiMethod::LogNormal,
                       CiMethod::ExactPoisson, CiMethod::Wilson, CiMethod::ClopperPearson, CiMethod::BootstrapPercentile,
                       CiMethod::BootstrapBca})
        CHECK(ciMethodLabel(m).find('_') == std::string::npos);
}
