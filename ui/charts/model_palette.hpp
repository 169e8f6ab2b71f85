#pragma once

#include <QColor>

namespace plumbline {

// One colour per model, the same in every chart and table: the Okabe–Ito colour-blind-safe
// palette (Okabe & Ito 2008, "Color Universal Design"), most distinct colours first.
QColor modelColour(int modelIndex);

// The same colour, translucent, for bands.
QColor bandColour(int modelIndex);

} // namespace plumbline
