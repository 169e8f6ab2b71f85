#pragma once

// The check datasets of docs/methods.md §2 (Toy-20, HM-109, Gen-1000), defined exactly as there.
#include <cmath>
#include <cstdint>
#include <vector>

namespace plumbline::test {

struct CheckData {
    std::vector<std::uint8_t> y;
    std::vector<double> p;
};

// Toy-20: hand-checkable, ties within and across classes.
inline CheckData toy20A()
{
    return {{0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 1, 0, 1, 0, 1, 0, 1, 1, 1, 0},
            {.05, .08, .10, .10, .12, .15, .20, .20, .25, .30, .30, .35, .40, .45, .50, .55, .60, .70, .80, .90}};
}
inline CheckData toy20B()
{
    return {toy20A().y,
            {.08, .05, .12, .20, .10, .15, .25, .18, .30, .22, .40, .35, .50, .38, .60, .45, .70, .65, .85, .75}};
}

// HM-109: Hanley & McNeil (1982, Radiology 143:29) Table 1, ratings 1-5 of 109 CT images; the
// counts are as commonly reprinted from that table, not re-checked against the printed paper
// (docs/methods.md §2).
inline CheckData hm109()
{
    const int normal[5] = {33, 6, 6, 11, 2};
    const int abnormal[5] = {3, 2, 2, 11, 33};
    CheckData d;
    for (int rating = 1; rating <= 5; ++rating) {
        for (int k = 0; k < normal[rating - 1]; ++k) {
            d.y.push_back(0);
            d.p.push_back(rating);
        }
        for (int k = 0; k < abnormal[rating - 1]; ++k) {
            d.y.push_back(1);
            d.p.push_back(rating);
        }
    }
    return d;
}

// Gen-1000: deterministic synthetic cohort; the model over-predicts and is too extreme.
inline CheckData gen1000()
{
    CheckData d;
    for (int i = 0; i < 1000; ++i) {
        const double lpTrue = -2.0 + 3.0 * (i / 999.0) - 0.5;
        const double u = ((i * 7919) % 1000 + 0.5) / 1000.0;
        d.y.push_back(u < 1.0 / (1.0 + std::exp(-lpTrue)) ? 1 : 0);
        d.p.push_back(1.0 / (1.0 + std::exp(-(0.3 + 1.25 * lpTrue))));
    }
    return d;
}

} // namespace plumbline::test
