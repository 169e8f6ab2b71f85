#include "charts/model_palette.hpp"

#include <array>

namespace plumbline {

QColor modelColour(int modelIndex)
{
    static const std::array<QColor, 7> colours{QColor(0, 114, 178),  QColor(213, 94, 0),  QColor(0, 158, 115),
                                               QColor(204, 121, 167), QColor(230, 159, 0), QColor(86, 180, 233),
                                               QColor(0, 0, 0)};
    return colours[static_cast<std::size_t>(modelIndex) % colours.size()];
}

QColor bandColour(int modelIndex)
{
    QColor colour = modelColour(modelIndex);
    colour.setAlpha(50);
    return colour;
}

} // namespace plumbline
