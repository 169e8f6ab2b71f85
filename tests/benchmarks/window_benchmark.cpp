// plumbline-window-bench: the window's path on a large cohort, as a person starts it (File → Open's
// request, a Run), timed from the Run to the first charts (the analytic panel shown) and to the
// end (the bootstrap's intervals shown). Reports numbers, never pass/fail; run_benchmarks.sh sets
// QT_QPA_PLATFORM=offscreen and compares the total with the CLI's run of the same analysis.
//
//   plumbline-window-bench FILE REPLICATES
#include "run/analysis_request.hpp"
#include "huge_pages.hpp"
#include "main_window.hpp"
#include "run/validation_task.hpp"

#include <QApplication>
#include <QElapsedTimer>
#include <QTimer>

#include <cstdio>
#include <cstdlib>

int main(int argc, char** argv)
{
    plumbline::restartWithHugePages(argv); // as the entry points do
    if (argc < 3) {
        std::fprintf(stderr, "usage: plumbline-window-bench FILE REPLICATES\n");
        return 2;
    }
    QApplication app(argc, argv);
    plumbline::MainWindow window;
    window.resize(1280, 720);
    window.show();
    plumbline::AnalysisRequest request;
    request.intake.cohortFile = argv[1];
    request.intake.outcomeColumn = "readmitted_30d";
    request.intake.scoreColumns = {"supplier_score"};
    request.bootstrap.replicates = std::strtoul(argv[2], nullptr, 10);
    QElapsedTimer clock;
    double firstCharts = -1.0, total = -1.0;
    QObject::connect(window.task(), &plumbline::ValidationTask::panelReady, &app, [&] {
        // Measured once the staged display has run: after the event loop has drained.
        QTimer::singleShot(0, &app, [&] {
            QCoreApplication::processEvents();
            if (firstCharts < 0)
                firstCharts = double(clock.elapsed()) / 1000.0;
        });
    });
    QObject::connect(window.task(), &plumbline::ValidationTask::finished, &app, [&] {
        total = double(clock.elapsed()) / 1000.0;
        if (firstCharts < 0)
            firstCharts = total;
        app.quit();
    });
    QObject::connect(window.task(), &plumbline::ValidationTask::failed, &app, [&](const QString& message) {
        std::fprintf(stderr, "failed: %s\n", qPrintable(message));
        app.exit(1);
    });
    QTimer::singleShot(0, &app, [&] {
        clock.start();
        window.runRequest(request);
    });
    if (app.exec() != 0)
        return 1;
    std::printf("plumbline window: replicates=%s first_charts_s=%.2f total_s=%.2f\n", argv[2], firstCharts, total);
    return 0;
}
