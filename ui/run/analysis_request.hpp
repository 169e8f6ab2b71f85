#pragma once

#include "files/analysis_file.hpp"
#include "analyses/bootstrap_engine.hpp"
#include "intake/intake_settings.hpp"
#include "analyses/panel_settings.hpp"

namespace plumbline {

// Everything a run needs: where the data are, how to read them, and the analysis options.
struct AnalysisRequest {
    IntakeSettings intake;
    PanelSettings panel;
    BootstrapSettings bootstrap;
    std::string addUpdated; // "", "intercept", "logistic" or "closed-test"
    ReportFields report;
    std::size_t minimumCell = 11;
    // What reading the analysis file found about its inputs (changed since saved, no SHA-256):
    // carried into the result's warnings and the report's provenance. Not saved.
    std::vector<std::string> inputWarnings;

    // The query result's SHA-256 is known only after a run: the caller adds it (queryResultSha256).
    AnalysisFile toAnalysisFile() const { return {intake, panel, bootstrap, addUpdated, minimumCell, report, {}}; }
    static AnalysisRequest fromAnalysisFile(const AnalysisFile& a)
    {
        return {a.intake, a.panel, a.bootstrap, a.addUpdated, a.report, a.minimumCell, {}};
    }
};

} // namespace plumbline
