#include "period_panel.hpp"

#include "forest_chart_view.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QSplitter>
#include <QVBoxLayout>

namespace plumbline {

PeriodPanel::PeriodPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new QComboBox)
    , m_c(new ForestChartView(tr("C statistic by period"), tr("C statistic")))
    , m_oe(new ForestChartView(tr("Observed / expected by period"), tr("O/E")))
    , m_note(new QLabel)
{
    m_model->setAccessibleName(tr("Model"));
    m_note->setWordWrap(true);
    m_note->setTextInteractionFlags(Qt::TextSelectableByMouse);
    auto* top = new QHBoxLayout;
    auto* label = new QLabel(tr("&Model:"));
    label->setBuddy(m_model);
    top->addWidget(label);
    top->addWidget(m_model, 1);
    auto* charts = new QSplitter(Qt::Horizontal);
    charts->addWidget(m_c);
    charts->addWidget(m_oe);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(charts, 1);
    layout->addWidget(m_note);
    connect(m_model, &QComboBox::currentIndexChanged, this, &PeriodPanel::showModel);
    setSnapshot(nullptr);
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
        m_c->setRows({}, Estimate::undefined(), std::nullopt, 0);
        m_oe->setRows({}, Estimate::undefined(), std::nullopt, 0);
        QString text = tr("No period column was chosen. Choose a date column in File → Open (Period), or give --period "
                          "on the command line.");
        if (m_snapshot)
            for (const auto& w : m_snapshot->validation.warnings)
                if (w.starts_with("No view over time"))
                    text = QString::fromStdString(w) + tr(" (Settings tab: Dates written as.)");
        m_note->setText(text);
        return;
    }
    const ModelValidation& model = m_snapshot->validation.models[std::size_t(index)];
    const PeriodAnalysis& periods = *m_snapshot->validation.periods;
    std::vector<ForestRow> c, oe;
    for (const auto& r : periods.results) {
        if (r.model != model.name)
            continue;
        c.push_back({r.period, r.c, false, {}});
        oe.push_back({r.period, r.oe, r.outsideFirstYear, {}}); // hollow; the note below says why
    }
    m_c->setRows(c, model.metrics[CStatistic].estimate, std::nullopt, index);
    m_oe->setRows(oe, model.metrics[OeRatio].estimate, 1.0, index);
    QStringList lines;
    for (const auto& w : periods.warnings)
        if (w.find("'" + model.name + "'") != std::string::npos)
            lines << QString::fromStdString(w);
    if (periods.undated > 0)
        lines << tr("%1 rows without a usable date are left out of this view.").arg(periods.undated);
    lines << tr("Periods marked hollow have an O/E or calibration-in-the-large interval that misses the first year's.");
    lines << QString::fromStdString(periods.note);
    m_note->setText(lines.join(QLatin1Char('\n')));
}

} // namespace plumbline
