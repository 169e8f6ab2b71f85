#pragma once

// What the window tests share: the sample cohort's request and a run that waits for its result.
#include "run/analysis_request.hpp"
#include "main_window.hpp"
#include "run/validation_task.hpp"

#include <QApplication>
#include <QElapsedTimer>
#include <QSignalSpy>
#include <QString>
#include <QTimer>

#include <functional>
#include <memory>

namespace plumbline::testing {

// Runs `drive` on the dialog of type T once it is open and modal; stops looking after a minute,
// so that a dialog that never opens fails the test instead of hanging it.
template <typename T>
void whenOpen(const std::function<void(T*)>& drive)
{
    auto* poll = new QTimer;
    auto started = std::make_shared<QElapsedTimer>();
    started->start();
    QObject::connect(poll, &QTimer::timeout, poll, [poll, drive, started] {
        if (auto* dialog = qobject_cast<T*>(QApplication::activeModalWidget())) {
            poll->stop();
            poll->deleteLater();
            drive(dialog);
        } else if (started->elapsed() > 60000) {
            poll->stop();
            poll->deleteLater();
        }
    });
    poll->start(50);
}

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
