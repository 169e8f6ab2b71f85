#pragma once

#include "bootstrap_engine.hpp"
#include "intake_settings.hpp"
#include "panel_settings.hpp"

namespace plumbline {

// Everything a run needs: where the data are, how to read them, and the analysis options.
struct AnalysisRequest {
    IntakeSettings intake;
    PanelSettings panel;
    BootstrapSettings bootstrap;
};

} // namespace plumbline
