#include "panels/period_panel.hpp"

#include "charts/period_chart_view.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QScrollArea>
#include <QSplitter>
#include <QVBoxLayout>

namespace plumbline {

PeriodPanel::PeriodPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new QComboBox)
    , m_c(new PeriodChartView(tr("C statistic by period"), tr("C statistic")))
    , m_oe(new PeriodChartView(tr("Observed / expected by period"), tr("O/E")))
    , m_citl(new PeriodChartView(tr("Calibration-in-the-large by period"), tr("Intercept (logit)")))
    , m_charts(new QSplitter(Qt::Horizontal))
    , m_note(new QLabel)
{
    m_model->setAccessibleName(tr("Model"));
    m_model->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    m_note->setWordWrap(true);
    m_note->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_note->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    auto* top = new QHBoxLayout;
    auto* label = new QLabel(tr("&Model:"));
    label->setBuddy(m_model);
    top->addWidget(label);
    top->addWidget(m_model);
    top->addStretch(1);
    m_charts->addWidget(m_c);
    m_charts->addWidget(m_oe);
    m_charts->addWidget(m_citl);
    // The note scrolls when the tab is short, so the charts keep their room.
    auto* noteArea = new QScrollArea;
    noteArea->setWidget(m_note);
    noteArea->setWidgetResizable(true);
    noteArea->setFrameShape(QFrame::NoFrame);
    noteArea->setMinimumHeight(40);
    noteArea->setMaximumHeight(110);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addLayout(top);
    layout->addWidget(m_charts, 1);
    layout->addWidget(noteArea);
    connect(m_model, &QComboBox::currentIndexChanged, this, &PeriodPanel::showModel);
    setSnapshot(nullptr);
}

void PeriodPanel::resetLayout()
{
    const int third = std::max(1, m_charts->width() / 3);
    m_charts->setSizes({third, third, third});
}

void PeriodPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    const QSignalBlocker block(m_model);
    m_model->clear();
    if (m_snapshot && m_snapshot->validation.periods)
        for (const auto& m : m_snapshot->validation.models)
            m_model->addItem(QString::fromStdString(m.name));
    m_model->setEnabled(m_model->count() > 0);
    showModel(m_model->currentIndex());
}

QString PeriodPanel::noteText() const
{
    return m_note->text();
}

void PeriodPanel::showModel(int index)
{
    if (index < 0 || !m_snapshot || !m_snapshot->validation.periods) {
        for (PeriodChartView* chart : {m_c, m_oe, m_citl})
            chart->setPoints({}, Estimate::undefined(), std::nullopt, 0);
        QString text = tr("No period column was chosen. Choose a date column in File → Open (Period), or give --period "
                          "on the command line.");
        if (m_snapshot)
            for (const auto& w : m_snapshot->validation.warnings)
                if (w.starts_with("No view over time"))
                    text = QString::fromStdString(w);
        m_note->setText(text);
        return;
    }
    const ModelValidation& model = m_snapshot->validation.models[std::size_t(index)];
    const PeriodAnalysis& periods = *m_snapshot->validation.periods;
    std::vector<PeriodPoint> c, oe, citl;
    for (const auto& r : periods.results) {
        if (r.model != model.name)
            continue;
        c.push_back({r.period, r.c, false});
        oe.push_back({r.period, r.oe, r.outsideFirstYear});
        citl.push_back({r.period, r.calibrationIntercept, r.outsideFirstYear});
    }
    PeriodReference reference;
    for (const auto& f : periods.firstYear)
        if (f.model == model.name)
            reference = f;
    m_c->setPoints(c, reference.c, std::nullopt, index);
    m_oe->setPoints(oe, reference.oe, 1.0, index);
    m_citl->setPoints(citl, reference.calibrationIntercept, 0.0, index);
    QStringList lines;
    for (const auto& w : periods.warnings)
        if (w.find("'" + model.name + "'") != std::string::npos)
            lines << QString::fromStdString(w);
    if (periods.undated > 0)
        lines << (periods.undated == 1 ? tr("1 row without a usable date is left out of this view.")
                                       : tr("%1 rows without a usable date are left out of this view.").arg(periods.undated));
    lines << tr("Hollow points: periods whose O/E or calibration-in-the-large interval misses the first year's (shaded).");
    lines << QString::fromStdString(periods.note);
    m_note->setText(lines.join(QLatin1Char('\n')));
}

} // namespace plumbline
