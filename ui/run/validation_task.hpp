#pragma once

#include "run/analysis_snapshot.hpp"

#include <QObject>
#include <QString>

#include <atomic>
#include <memory>
#include <stop_token>
#include <thread>

namespace plumbline {

// Runs intake, the metric panel and the bootstrap on a worker thread: a request in, a snapshot
// out, progress and cancel in between. Signals arrive on the thread that owns the task (the
// GUI thread), throttled; the GUI thread never waits on a computation.
class ValidationTask : public QObject {
    Q_OBJECT
public:
    explicit ValidationTask(QObject* parent = nullptr);
    ~ValidationTask() override;

    // Starts a run; a run already going is cancelled first.
    void start(AnalysisRequest request);
    void cancel();
    bool isRunning() const { return m_running; }

signals:
    void progressed(int percent, const QString& stage);
    // The panel with analytic intervals, as soon as it is ready, while the bootstrap still runs;
    // `finished` then brings the same panel with the bootstrap's intervals and bands.
    void panelReady(plumbline::SnapshotPointer snapshot);
    void finished(plumbline::SnapshotPointer snapshot);
    void failed(const QString& message);
    void cancelled();

private:
    void run(AnalysisRequest request, std::stop_token stop, unsigned generation);
    void post(unsigned generation, std::function<void()> toGuiThread);

    std::jthread m_worker;
    std::atomic<unsigned> m_generation{0};
    bool m_running = false;
};

} // namespace plumbline
