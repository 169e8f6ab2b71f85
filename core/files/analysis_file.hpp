#pragma once

#include "analyses/bootstrap_engine.hpp"
#include "intake/input_error.hpp"
#include "intake/intake_settings.hpp"
#include "analyses/panel_settings.hpp"
#include "intake/text_file.hpp"

#include <expected>
#include <string>
#include <vector>

namespace plumbline {

// Free text of a report's title and scope, typed by the analyst (TRIPOD items 1, 4-6).
struct ReportFields {
    std::string title;              // e.g. "External validation of the supplier's 30-day readmission score"
    std::string model;              // model name and version
    std::string outcome;            // outcome definition and horizon
    std::string population;         // who was included
    std::string period;             // when
    std::string notes;              // the reviewer's notes
};

// Everything needed to re-run an analysis exactly: our own JSON format, "*.plumbline.json".
// Input paths are stored relative to the analysis file, with each input's SHA-256 so that a
// changed input is noticed when the analysis is opened again.
struct AnalysisFile {
    IntakeSettings intake;
    PanelSettings panel;
    BootstrapSettings bootstrap;
    std::string addUpdated;         // "", "intercept", "logistic" or "closed-test"
    std::size_t minimumCell = 11;   // small-cell rule of the reports
    ReportFields report;
    // A query's cohort has no file to fingerprint: the SHA-256 of its result set when the
    // analysis was saved (empty when unknown), compared with the result on the next run.
    std::string queryResultSha256;
};

// Writes the analysis (atomically), fingerprinting the inputs as they are now.
std::expected<void, InputError> saveAnalysisFile(const std::string& path, const AnalysisFile& analysis);

// How an analysis file may be read.
struct AnalysisFileReading {
    bool allowOutsidePaths = false; // inputs named by an absolute path or outside the file's folder
    bool strictInputs = false;      // a changed input or a missing SHA-256 refuses the analysis
};

// Reads an analysis file; paths come back resolved against its folder. Every value is checked
// (type, range, known names) and a value that cannot be used is refused naming the key. An input
// outside the file's folder is refused (ErrorKind::OutsideFolder) unless allowed. `warnings`
// tells when an input is missing, has no recorded SHA-256, or no longer matches it. A query's
// result can only be compared once the query has run: see queryResultChange.
std::expected<AnalysisFile, InputError> loadAnalysisFile(const std::string& path, std::vector<std::string>& warnings,
                                                         const AnalysisFileReading& reading = {});
// The same on a file already in memory (its name places its inputs).
std::expected<AnalysisFile, InputError> readAnalysisFile(const TextFile& file, std::vector<std::string>& warnings,
                                                         const AnalysisFileReading& reading = {});

// The warning for a query whose result is not the one the analysis was saved with (nullopt when it
// is, or when no hash was saved).
std::optional<std::string> queryResultChange(const AnalysisFile& analysis, const std::string& resultSha256);

} // namespace plumbline
