#include "panels/comparison_panel.hpp"

#include "metrics/metric_reading.hpp"

#include "analyses/model_comparison.hpp"
#include "charts/roc_chart_view.hpp"
#include "reporting/value_text.hpp"

#include <QComboBox>
#include <QCoreApplication>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QVBoxLayout>

namespace plumbline {

namespace {

QString differenceName(const std::string& key)
{
    return QString::fromStdString(differenceLabel(key));
}

QString number(const std::optional<double>& v, int digits = 4)
{
    return QString::fromStdString(fixedText(v, digits));
}

} // namespace

ComparisonPanel::ComparisonPanel(QWidget* parent)
    : QWidget(parent)
    , m_pair(new QComboBox)
    , m_differences(new QTableWidget)
    , m_reclassification(new QTableWidget)
    , m_atThreshold(new QLabel)
    , m_cautions(new QLabel)
{
    m_differences->setColumnCount(5);
    m_differences->setHorizontalHeaderLabels({tr("Difference (B − A)"), tr("Estimate"), tr("Interval"), tr("Interval from"), tr("Test")});
    m_differences->verticalHeader()->hide();
    m_differences->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_differences->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_differences->setAccessibleName(tr("Differences between the two models"));
    m_reclassification->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_reclassification->setAccessibleName(tr("Reclassification table"));
    m_cautions->setWordWrap(true);
    m_cautions->setStyleSheet(QStringLiteral("color:#5a4500; background:#fff8e1; padding:4px;"));
    m_atThreshold->setWordWrap(true);
    auto* pairRow = new QHBoxLayout;
    auto* pairLabel = new QLabel(tr("&Compare:"));
    pairLabel->setBuddy(m_pair);
    pairRow->addWidget(pairLabel);
    pairRow->addWidget(m_pair, 1);
    auto* tables = new QHBoxLayout;
    tables->addWidget(m_differences, 3);
    auto* right = new QVBoxLayout;
    right->addWidget(m_atThreshold);
    right->addWidget(new QLabel(tr("Reclassification at the cut-points (rows: model A, columns: model B)")));
    right->addWidget(m_reclassification, 1);
    tables->addLayout(right, 2);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(pairRow);
    layout->addLayout(tables, 1);
    layout->addWidget(m_cautions);
    connect(m_pair, &QComboBox::currentIndexChanged, this, &ComparisonPanel::showPair);
}

void ComparisonPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    const QSignalBlocker block(m_pair);
    m_pair->clear();
    if (m_snapshot)
        for (const auto& c : m_snapshot->validation.comparisons)
            m_pair->addItem(tr("B: %1  against  A: %2").arg(QString::fromStdString(c.modelB), QString::fromStdString(c.modelA)));
    QStringList cautions;
    for (const auto& caution : comparisonCautions())
        cautions << QString::fromStdString(caution);
    m_cautions->setText(cautions.join(QLatin1Char('\n')));
    setEnabled(m_pair->count() > 0);
    showPair(m_pair->count() > 0 ? 0 : -1);
}

void ComparisonPanel::setThreshold(double threshold)
{
    m_threshold = threshold;
    showPair(m_pair->currentIndex());
}

QString ComparisonPanel::thresholdText() const
{
    return m_atThreshold->text();
}

void ComparisonPanel::showPair(int index)
{
    m_differences->setRowCount(0);
    m_reclassification->clear();
    m_atThreshold->setText(m_pair->count() == 0 ? tr("Open a cohort with two or more score columns to compare models.") : QString());
    if (!m_snapshot || index < 0 || index >= int(m_snapshot->validation.comparisons.size()))
        return;
    const ModelComparison& c = m_snapshot->validation.comparisons[std::size_t(index)];
    auto addRow = [this](const QString& name, const DifferenceEstimate& d) {
        const int row = m_differences->rowCount();
        m_differences->insertRow(row);
        const QString interval = d.estimate.lower ? QStringLiteral("%1 to %2").arg(number(d.estimate.lower), number(d.estimate.upper)) : QStringLiteral("–");
        const QString source = d.estimate.lower ? QString::fromStdString(ciMethodLabel(d.estimate.ciMethod)) : QString();
        const QString p = d.pValue ? QString::fromStdString(pValueText(*d.pValue)) : QStringLiteral("–");
        const QStringList cells{name, number(d.estimate.value), interval, source, p};
        for (int column = 0; column < cells.size(); ++column)
            m_differences->setItem(row, column, new QTableWidgetItem(cells[column]));
    };
    for (const auto& d : c.differences)
        addRow(differenceName(d.key), d);
    for (std::size_t t = 0; t < c.netBenefitDifferences.size(); ++t)
        addRow(tr("Net benefit at %1").arg(c.netBenefitThresholds[t], 0, 'f', 2), c.netBenefitDifferences[t]);

    // What the shared threshold means for both models (looked up, not computed).
    auto modelIndex = [&](const std::string& name) {
        for (std::size_t m = 0; m < m_snapshot->validation.models.size(); ++m)
            if (m_snapshot->validation.models[m].name == name)
                return m;
        return std::size_t(0);
    };
    const auto& a = m_snapshot->validation.models[modelIndex(c.modelA)];
    const auto& b = m_snapshot->validation.models[modelIndex(c.modelB)];
    if (!a.operatingPoints.empty() && !b.operatingPoints.empty()) {
        const std::size_t k = std::min(operatingPointIndex(m_threshold), a.operatingPoints.size() - 1);
        const OperatingPointSummary sa = summarise(a.operatingPoints[k]), sb = summarise(b.operatingPoints[k]);
        m_atThreshold->setText(tr("At threshold %1: A flags %2 %, sensitivity %3, net benefit %4; "
                                  "B flags %5 %, sensitivity %6, net benefit %7.")
                                   .arg(m_threshold, 0, 'f', 3)
                                   .arg(100.0 * sa.flagRate, 0, 'f', 1).arg(number(sa.sensitivity, 3)).arg(number(sa.netBenefit, 4))
                                   .arg(100.0 * sb.flagRate, 0, 'f', 1).arg(number(sb.sensitivity, 3)).arg(number(sb.netBenefit, 4)));
    }
    const ReclassificationTable& r = c.reclassification;
    const int categories = int(r.events.size());
    if (categories == 0)
        return;
    QStringList labels;
    for (int k = 0; k < categories; ++k) {
        const QString low = k == 0 ? QStringLiteral("0") : QString::number(r.cutPoints[std::size_t(k - 1)]);
        const QString high = k == categories - 1 ? QStringLiteral("1") : QString::number(r.cutPoints[std::size_t(k)]);
        labels << QStringLiteral("[%1, %2)").arg(low, high);
    }
    m_reclassification->setRowCount(2 * categories);
    m_reclassification->setColumnCount(categories);
    m_reclassification->setHorizontalHeaderLabels(labels);
    QStringList rows;
    for (int k = 0; k < categories; ++k)
        rows << tr("events %1").arg(labels[k]);
    for (int k = 0; k < categories; ++k)
        rows << tr("non-events %1").arg(labels[k]);
    m_reclassification->setVerticalHeaderLabels(rows);
    for (int i = 0; i < categories; ++i)
        for (int j = 0; j < categories; ++j) {
            m_reclassification->setItem(i, j, new QTableWidgetItem(QString::number(r.events[std::size_t(i)][std::size_t(j)])));
            m_reclassification->setItem(categories + i, j, new QTableWidgetItem(QString::number(r.nonEvents[std::size_t(i)][std::size_t(j)])));
        }
    m_reclassification->resizeColumnsToContents();
}

} // namespace plumbline
