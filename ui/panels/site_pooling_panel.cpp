#include "panels/site_pooling_panel.hpp"

#include "charts/site_forest_view.hpp"
#include "metrics/metric_reading.hpp"
#include "reporting/cautions.hpp"
#include "reporting/site_pooling_text.hpp"
#include "reporting/value_text.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QScrollArea>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>

namespace plumbline {

namespace {

QString range(const std::optional<double>& low, const std::optional<double>& high)
{
    return low && high ? QStringLiteral("%1 to %2").arg(QString::fromStdString(fixedText(*low, 3)), QString::fromStdString(fixedText(*high, 3)))
                       : QStringLiteral("–");
}

} // namespace

SitePoolingPanel::SitePoolingPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new QComboBox)
    , m_c(new SiteForestView(tr("C statistic by site"), tr("C statistic")))
    , m_oe(new SiteForestView(tr("Observed / expected by site"), tr("O/E")))
    , m_slope(new SiteForestView(tr("Calibration slope by site"), tr("Calibration slope")))
    , m_charts(new QSplitter(Qt::Horizontal))
    , m_table(new QTableWidget)
    , m_note(new QLabel)
{
    m_model->setAccessibleName(tr("Model"));
    m_model->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    m_c->setObjectName(QStringLiteral("site-forest-c"));
    m_oe->setObjectName(QStringLiteral("site-forest-oe"));
    m_slope->setObjectName(QStringLiteral("site-forest-slope"));
    m_note->setWordWrap(true);
    m_note->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_note->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    m_table->setAccessibleName(tr("Pooled performance across sites"));
    m_table->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_table->verticalHeader()->setVisible(false);
    m_table->setColumnCount(8);
    m_table->setHorizontalHeaderLabels({tr("Measure"), tr("Sites"), tr("Pooled"), tr("HKSJ interval"), tr("New site (prediction)"),
                                        tr("τ² REML (DL)"), tr("I²"), tr("P(acceptable)")});
    m_table->horizontalHeader()->setStretchLastSection(true);
    // Room for the header and the three measures, so a 720-pixel screen shows the whole table.
    m_table->setMinimumHeight(m_table->horizontalHeader()->sizeHint().height() + 3 * m_table->verticalHeader()->defaultSectionSize() + 4);
    auto* top = new QHBoxLayout;
    auto* label = new QLabel(tr("&Model:"));
    label->setBuddy(m_model);
    top->addWidget(label);
    top->addWidget(m_model);
    top->addStretch(1);
    m_charts->addWidget(m_c);
    m_charts->addWidget(m_oe);
    m_charts->addWidget(m_slope);
    auto* lower = new QSplitter(Qt::Vertical);
    lower->addWidget(m_charts);
    lower->addWidget(m_table);
    lower->setStretchFactor(0, 3);
    lower->setStretchFactor(1, 1);
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
    layout->addWidget(lower, 1);
    layout->addWidget(noteArea);
    connect(m_model, &QComboBox::currentIndexChanged, this, &SitePoolingPanel::showModel);
    setSnapshot(nullptr);
}

void SitePoolingPanel::resetLayout()
{
    const int third = std::max(1, m_charts->width() / 3);
    m_charts->setSizes({third, third, third});
}

QString SitePoolingPanel::noteText() const
{
    return m_note->text();
}

void SitePoolingPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    const QSignalBlocker block(m_model);
    m_model->clear();
    if (m_snapshot && m_snapshot->validation.sites)
        for (const auto& m : m_snapshot->validation.sites->models)
            m_model->addItem(QString::fromStdString(m.model));
    m_model->setEnabled(m_model->count() > 0);
    showModel(m_model->currentIndex());
}

void SitePoolingPanel::showModel(int index)
{
    m_table->setRowCount(0);
    if (index < 0 || !m_snapshot || !m_snapshot->validation.sites) {
        for (SiteForestView* chart : {m_c, m_oe, m_slope})
            chart->clear();
        m_note->setText(tr("No site column was chosen. Choose one in File → Open (Site column), or give --cluster on the "
                           "command line."));
        return;
    }
    const SitePooling& sites = *m_snapshot->validation.sites;
    const ModelSitePooling& model = sites.models[std::size_t(index)];
    for (SiteForestView* chart : {m_c, m_oe, m_slope})
        chart->clear();
    const NewSiteAcceptability& a = model.acceptability;
    for (const PooledMeasure& m : model.measures) {
        if (m.measure == "c_statistic")
            m_c->setMeasure(m, std::nullopt, index);
        else if (m.measure == "oe_ratio")
            m_oe->setMeasure(m, 1.0, index);
        else
            m_slope->setMeasure(m, 1.0, index);
        const int row = m_table->rowCount();
        m_table->insertRow(row);
        QString probability = QStringLiteral("–");
        for (std::size_t i = 0; i < a.measures.size(); ++i)
            if (a.measures[i] == m.measure)
                probability = QString::fromStdString(fixedText(a.probabilities[i], 2));
        const QStringList cells{QString::fromStdString(metricLabel(m.measure)),
                                QString::number(m.sites.size()),
                                QString::fromStdString(fixedText(m.pooled, 3, "–")),
                                range(m.hksjLower, m.hksjUpper),
                                range(m.predictionLower, m.predictionUpper),
                                m.pool ? QStringLiteral("%1 (%2)").arg(QString::fromStdString(fixedText(m.pool->tau2Reml, 4)),
                                                                       QString::fromStdString(fixedText(m.pool->tau2DerSimonianLaird, 4)))
                                       : QStringLiteral("–"),
                                m.pool ? QStringLiteral("%1 %").arg(QString::fromStdString(fixedText(m.pool->i2 * 100.0, 0))) : QStringLiteral("–"),
                                probability};
        for (int col = 0; col < cells.size(); ++col)
            m_table->setItem(row, col, new QTableWidgetItem(cells[col]));
    }
    m_table->resizeColumnsToContents();
    QStringList lines;
    lines << tr("Site column '%1': %2, pooled by random effects (REML τ², DerSimonian–Laird beside it); the diamond spans "
                "the Hartung–Knapp–Sidik–Jonkman interval and the bar beneath it the prediction interval for a new site.")
                 .arg(QString::fromStdString(sites.column), QString::fromStdString(siteCountText(sites.sites)));
    if (a.joint)
        lines << tr("Probability that a new site meets all criteria (%1): %2 — %3; %4 draws, seed %5.")
                     .arg(QString::fromStdString(acceptableCriteriaText(sites.criteria)), QString::fromStdString(fixedText(*a.joint, 2)),
                          QString::fromStdString(a.method))
                     .arg(a.draws)
                     .arg(a.seed);
    for (const auto& note : a.notes)
        lines << QString::fromStdString(note);
    for (const auto& w : sites.warnings)
        lines << QString::fromStdString(w);
    for (const PooledMeasure& m : model.measures) {
        if (m.sitesLeftOut > 0)
            lines << tr("%1: %2 left out (%3)")
                         .arg(QString::fromStdString(metricLabel(m.measure)), QString::fromStdString(siteCountText(m.sitesLeftOut)),
                              QString::fromStdString(m.leftOut.empty() ? std::string("-") : m.leftOut.front()));
        if (const auto why = noPredictionIntervalReason(m))
            lines << QString::fromStdString(metricLabel(m.measure) + ": " + *why + ".");
        if (m.pool)
            for (const auto& w : m.pool->warnings)
                if (w.find("poorly estimated") == std::string::npos) // said once above, for the column
                    lines << QString::fromStdString(metricLabel(m.measure) + ": " + w);
    }
    for (const auto caution : siteCautionsFor(sites))
        lines << QString::fromUtf8(caution.data(), qsizetype(caution.size()));
    m_note->setText(lines.join(QLatin1Char('\n')));
}

} // namespace plumbline
