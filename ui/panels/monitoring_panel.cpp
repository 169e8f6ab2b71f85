#include "panels/monitoring_panel.hpp"

#include "charts/case_mix_view.hpp"
#include "charts/monitoring_path_view.hpp"
#include "metrics/population_stability.hpp"
#include "reporting/value_text.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QScrollArea>
#include <QSplitter>
#include <QVBoxLayout>

namespace plumbline {

namespace {

QString text(const std::string& s)
{
    return QString::fromStdString(s);
}

// The signals shown in the note: the first few and the count; the JSON and the report list all.
constexpr std::size_t signalsListed = 8;

} // namespace

MonitoringPanel::MonitoringPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new QComboBox)
    , m_scope(new QComboBox)
    , m_vlad(new MonitoringPathView(tr("Cumulative expected − observed"), tr("Expected − observed")))
    , m_caseMix(new CaseMixView)
    , m_worse(new MonitoringPathView(tr("CUSUM: worse than predicted"), tr("CUSUM")))
    , m_better(new MonitoringPathView(tr("CUSUM: better than predicted"), tr("CUSUM")))
    , m_rows(new QSplitter(Qt::Vertical))
    , m_top(new QSplitter(Qt::Horizontal))
    , m_bottom(new QSplitter(Qt::Horizontal))
    , m_note(new QLabel)
{
    m_model->setAccessibleName(tr("Model"));
    m_scope->setAccessibleName(tr("Scope"));
    for (QComboBox* box : {m_model, m_scope})
        box->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    m_note->setWordWrap(true);
    m_note->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_note->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    auto* top = new QHBoxLayout;
    auto* modelLabel = new QLabel(tr("&Model:"));
    modelLabel->setBuddy(m_model);
    auto* scopeLabel = new QLabel(tr("&Scope:"));
    scopeLabel->setBuddy(m_scope);
    top->addWidget(modelLabel);
    top->addWidget(m_model);
    top->addSpacing(12);
    top->addWidget(scopeLabel);
    top->addWidget(m_scope);
    top->addStretch(1);
    m_top->addWidget(m_vlad);
    m_top->addWidget(m_caseMix);
    m_bottom->addWidget(m_worse);
    m_bottom->addWidget(m_better);
    m_rows->addWidget(m_top);
    m_rows->addWidget(m_bottom);
    auto* noteArea = new QScrollArea;
    noteArea->setWidget(m_note);
    noteArea->setWidgetResizable(true);
    noteArea->setFrameShape(QFrame::NoFrame);
    noteArea->setMinimumHeight(40);
    noteArea->setMaximumHeight(130);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addLayout(top);
    layout->addWidget(m_rows, 1);
    layout->addWidget(noteArea);
    connect(m_model, &QComboBox::currentIndexChanged, this, &MonitoringPanel::showScope);
    connect(m_scope, &QComboBox::currentIndexChanged, this, &MonitoringPanel::showScope);
    setSnapshot(nullptr);
}

void MonitoringPanel::resetLayout()
{
    const int half = std::max(1, m_rows->height() / 2), across = std::max(1, m_top->width() / 2);
    m_rows->setSizes({half, half});
    m_top->setSizes({across, across});
    m_bottom->setSizes({across, across});
}

void MonitoringPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    {
        const QSignalBlocker blockModel(m_model);
        const QSignalBlocker blockScope(m_scope);
        m_model->clear();
        m_scope->clear();
        if (m_snapshot && m_snapshot->validation.monitoring) {
            const MonitoringAnalysis& m = *m_snapshot->validation.monitoring;
            for (const auto& model : m_snapshot->validation.models)
                m_model->addItem(text(model.name));
            // Scopes are the same for every model: the whole cohort, then each site.
            for (const auto& scope : m.scopes)
                if (!m.scopes.empty() && scope.model == m.scopes.front().model)
                    m_scope->addItem(scope.site.empty() ? tr("All patients") : text(scope.site), text(scope.site));
        }
        m_model->setEnabled(m_model->count() > 0);
        m_scope->setEnabled(m_scope->count() > 1);
    }
    showScope();
}

QString MonitoringPanel::noteText() const
{
    return m_note->text();
}

void MonitoringPanel::showScope()
{
    const MonitoringScope* scope = nullptr;
    const int modelIndex = m_model->currentIndex();
    if (m_snapshot && m_snapshot->validation.monitoring && modelIndex >= 0 && m_scope->currentIndex() >= 0) {
        const std::string model = m_snapshot->validation.models[std::size_t(modelIndex)].name;
        const std::string site = m_scope->currentData().toString().toStdString();
        for (const auto& s : m_snapshot->validation.monitoring->scopes)
            if (s.model == model && s.site == site)
                scope = &s;
    }
    if (!scope) {
        m_vlad->setPath({}, std::nullopt, {}, 0);
        m_worse->setPath({}, std::nullopt, {}, 0);
        m_better->setPath({}, std::nullopt, {}, 0);
        m_caseMix->setPoints({}, 0);
        QString note = tr("No monitoring: it needs a date column (File → Open, Period, or --period on the command line) and risks.");
        if (m_snapshot && m_snapshot->validation.monitoring && !m_snapshot->validation.monitoring->notes.empty())
            note = text(m_snapshot->validation.monitoring->notes.front());
        m_note->setText(note);
        return;
    }
    m_vlad->setPath(scope->expectedMinusObserved, std::nullopt, {}, modelIndex);
    std::vector<CaseMixPoint> caseMix;
    for (const auto& row : scope->periods)
        caseMix.push_back({row.period, row.values.meanPredicted, row.values.observedRate, row.psi});
    m_caseMix->setPoints(caseMix, modelIndex);
    QStringList lines;
    for (const auto& note : m_snapshot->validation.monitoring->notes)
        lines << text(note);
    lines << tr("%1 patients from %2 to %3, in date order (within a day in file order). Expected minus observed at the end: %4 "
                "(above zero: fewer events than predicted).")
                 .arg(scope->patients)
                 .arg(text(scope->firstDate), text(scope->lastDate), text(fixedText(scope->finalExpectedMinusObserved, 1)));
    for (std::size_t k = 0; k < scope->charts.size(); ++k) {
        const CusumChart& chart = scope->charts[k];
        std::vector<PathPoint> marks;
        for (const auto& signal : chart.signalList)
            marks.push_back({signal.patient, chart.limit.limit});
        (k == 0 ? m_worse : m_better)->setPath(chart.path, chart.limit.limit, marks, modelIndex);
        QString line = tr("CUSUM %1 (odds ratio %2): h %3 gives an in-control run length of %4 ± %5 patients (target %6 = %7 years of "
                          "this volume; %8 simulated runs, seed %9).")
                           .arg(chart.direction == CusumDirection::Worse ? tr("worse") : tr("better"))
                           .arg(text(fixedText(chart.oddsRatio, 2)), text(fixedText(chart.limit.limit, 2)),
                                text(fixedText(chart.limit.averageRunLength, 0)), text(fixedText(chart.limit.standardError, 0)),
                                text(fixedText(chart.targetRunLength, 0)), text(fixedText(m_snapshot->validation.monitoring->settings.targetYears, 1)))
                           .arg(chart.limit.runs)
                           .arg(chart.seed);
        if (!chart.limit.reached)
            line += tr(" The target was not reached: the risks hardly move this chart.");
        if (chart.signalList.empty()) {
            line += tr(" No signal.");
        } else {
            QStringList listed;
            for (std::size_t s = 0; s < std::min(signalsListed, chart.signalList.size()); ++s) {
                const CusumSignal& signal = chart.signalList[s];
                // No site for the whole-network scope: the patient who tipped a pooled sum says
                // nothing about where the excess lies.
                listed << tr("%1 after %2 patients").arg(text(signal.date)).arg(signal.patientsSinceReset);
            }
            line += tr(" %n signal(s): ", nullptr, int(chart.signalList.size())) + listed.join(QStringLiteral("; "))
                    + (chart.signalList.size() > signalsListed
                           ? tr("; and %1 more").arg(chart.signalList.size() - signalsListed)
                           : QString())
                    + QLatin1Char('.');
        }
        lines << line;
    }
    if (scope->latestYearPsi)
        lines << tr("Scores in the latest year against the first: PSI %1 (%2 shift; the bands 0.1 and 0.25 are common practice).")
                     .arg(text(fixedText(*scope->latestYearPsi, 3)), text(psiBand(*scope->latestYearPsi)));
    if (!scope->question.empty() && scope->codingShift)
        lines << text(scope->question)
                     + tr(" Mean predicted risk %1 in the first year, %2 in the latest; observed rate %3 then, %4 now.")
                           .arg(text(fixedText(scope->codingShift->firstYear.meanPredicted, 3)),
                                text(fixedText(scope->codingShift->latestYear.meanPredicted, 3)),
                                text(fixedText(scope->codingShift->firstYear.observedRate, 3)),
                                text(fixedText(scope->codingShift->latestYear.observedRate, 3)));
    m_note->setText(lines.join(QLatin1Char('\n')));
}

} // namespace plumbline
