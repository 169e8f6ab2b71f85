#pragma once

// What the window tests share: the sample cohort's request and a run that waits for its result.
#include "run/analysis_request.hpp"
#include "main_window.hpp"
#include "run/validation_task.hpp"

#include <QSignalSpy>
#include <QString>

namespace plumbline::testing {

inline const QString sampleFile = QStringLiteral(PLUMBLINE_SAMPLE_DATA "/readmissions.csv");

inline AnalysisRequest sampleRequest(std::size_t replicates, std::uint64_t seed = 99)
{
    AnalysisRequest request;
    request.intake.cohortFile = sampleFile.toStdString();
    request.intake.outcomeColumn = "readmitted_30d";
    request.intake.scoreColumns = {"supplier_score", "local_score"};
    request.bootstrap.replicates = replicates;
    request.bootstrap.seed = seed;
    return request;
}

inline bool runAndWait(MainWindow& window, const AnalysisRequest& request, int timeoutMs = 180000)
{
    QSignalSpy finished(window.task(), &ValidationTask::finished);
    window.runRequest(request);
    return finished.wait(timeoutMs);
}

} // namespace plumbline::testing
