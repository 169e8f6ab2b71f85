#include "run/validation_task.hpp"

#include <QMetaObject>

#include <chrono>
#include <exception>

namespace plumbline {

ValidationTask::ValidationTask(QObject* parent)
    : QObject(parent)
{
    qRegisterMetaType<plumbline::SnapshotPointer>("plumbline::SnapshotPointer");
}

ValidationTask::~ValidationTask()
{
    ++m_generation; // late results of the worker are dropped
    cancel();
}

void ValidationTask::start(AnalysisRequest request)
{
    cancel();
    const unsigned generation = ++m_generation;
    m_running = true;
    m_worker = std::jthread([this, request = std::move(request), generation](std::stop_token stop) {
        run(request, stop, generation);
    });
}

void ValidationTask::cancel()
{
    if (m_worker.joinable()) {
        m_worker.request_stop();
        m_worker.join(); // the core honours a stop within a replicate: milliseconds
    }
}

void ValidationTask::post(unsigned generation, std::function<void()> toGuiThread)
{
    QMetaObject::invokeMethod(
        this,
        [this, generation, toGuiThread = std::move(toGuiThread)] {
            if (generation == m_generation)
                toGuiThread();
        },
        Qt::QueuedConnection);
}

void ValidationTask::run(AnalysisRequest request, std::stop_token stop, unsigned generation)
{
    auto done = [this, generation](auto emitter) {
        post(generation, [this, emitter] {
            m_running = false;
            emitter();
        });
    };
    try {
        post(generation, [this] { emit progressed(0, tr("Reading the data")); });
        auto intake = runIntake(request.intake);
        if (!intake) {
            const QString message = QString::fromStdString(intake.error().message());
            done([this, message] { emit failed(message); });
            return;
        }
        if (stop.stop_requested()) {
            done([this] { emit cancelled(); });
            return;
        }
        post(generation, [this] { emit progressed(0, tr("Computing the metric panel")); });
        auto snapshot = std::make_shared<AnalysisSnapshot>();
        snapshot->request = request;
        snapshot->updates = addUpdatedModels(intake->cohort, request.addUpdated);
        // The CUSUM limits are simulated with the run's one seed, like the bootstrap.
        PanelSettings panel = request.panel;
        panel.monitoring.seed = request.bootstrap.seed;
        snapshot->validation = runValidation(intake->cohort, panel);
        snapshot->capacity = capacityLookup(snapshot->validation, intake->cohort, request.panel.dateFormat);
        snapshot->audit = intake->audit;
        snapshot->audit.warnings.insert(snapshot->audit.warnings.begin(), request.inputWarnings.begin(), request.inputWarnings.end());
        snapshot->cohort = std::make_shared<const Cohort>(std::move(intake->cohort));
        snapshot->inputs = intake->inputs;
        if (request.bootstrap.replicates > 0) {
            // The analytic panel first: a large cohort's bootstrap takes minutes, its charts and
            // tables need not wait for it.
            SnapshotPointer analytic = std::make_shared<const AnalysisSnapshot>(*snapshot);
            post(generation, [this, analytic] { emit panelReady(analytic); });
            // Progress comes at every percent from a worker; forward at most every 50 ms.
            auto last = std::chrono::steady_clock::now() - std::chrono::seconds(1);
            auto progress = [this, generation, &last, &request](std::size_t finished, std::size_t total) {
                const auto now = std::chrono::steady_clock::now();
                if (finished != total && now - last < std::chrono::milliseconds(50))
                    return;
                last = now;
                const int percent = int(finished * 100 / std::max<std::size_t>(total, 1));
                const QString stage = tr("Bootstrap: %1 of %2 replicates, %n model(s); analytic intervals shown until it ends", nullptr,
                                         int(request.intake.scoreColumns.size()))
                                          .arg(finished)
                                          .arg(total);
                post(generation, [this, percent, stage] { emit progressed(percent, stage); });
            };
            const auto bootstrap = runBootstrap(*snapshot->cohort, snapshot->validation, request.bootstrap, progress, stop);
            if (!bootstrap) {
                done([this] { emit cancelled(); });
                return;
            }
            applyBootstrap(snapshot->validation, *bootstrap);
        }
        SnapshotPointer result = std::move(snapshot);
        done([this, result] { emit finished(result); });
    } catch (const std::exception& error) {
        const QString message = tr("Internal error: %1. Please report it with the files and settings used.")
                                    .arg(QString::fromLocal8Bit(error.what()));
        done([this, message] { emit failed(message); });
    }
}

} // namespace plumbline
