#include "models/metric_table_model.hpp"

#include "metrics/metric_definitions.hpp"
#include "metrics/metric_reading.hpp"
#include "charts/model_palette.hpp"
#include "metrics/panel_keys.hpp"
#include "reporting/value_text.hpp"

namespace plumbline {

QString estimateText(const std::string& key, const Estimate& e)
{
    const bool small = key == "ici" || key == "e50" || key == "e90" || key == "emax" || key == "brier";
    return QString::fromStdString(plumbline::estimateText(e, small ? 4 : 3, QObject::tr("not computed").toStdString()));
}

MetricTableModel::MetricTableModel(QObject* parent)
    : QAbstractTableModel(parent)
{
}

void MetricTableModel::setSnapshot(SnapshotPointer snapshot)
{
    beginResetModel();
    m_snapshot = std::move(snapshot);
    endResetModel();
}

int MetricTableModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_snapshot ? 0 : static_cast<int>(PanelMetricCount);
}

int MetricTableModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_snapshot ? 0 : 1 + 2 * static_cast<int>(m_snapshot->validation.models.size());
}

QVariant MetricTableModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || !m_snapshot)
        return {};
    const auto key = panelKeys[static_cast<std::size_t>(index.row())];
    if (index.column() == 0) {
        if (role == Qt::DisplayRole)
            return QString::fromStdString(metricLabel(key));
        if (role == Qt::ToolTipRole) {
            const MetricDefinition d = metricDefinition(key);
            return QStringLiteral("<p>%1</p><p><i>%2</i></p>").arg(QString::fromUtf8(d.definition.data(), int(d.definition.size())),
                                                               QString::fromUtf8(d.source.data(), int(d.source.size())));
        }
        return {};
    }
    const int model = (index.column() - 1) / 2;
    const MetricEntry& entry = m_snapshot->validation.models[static_cast<std::size_t>(model)].metrics[static_cast<std::size_t>(index.row())];
    const bool estimateCell = (index.column() - 1) % 2 == 0;
    if (role == Qt::DisplayRole)
        return estimateCell ? estimateText(entry.key, entry.estimate)
                            : (entry.estimate.value ? QString::fromStdString(entry.reading) : tr("see the warnings"));
    if (role == Qt::UserRole && estimateCell)
        return entry.estimate.value ? QVariant(*entry.estimate.value) : QVariant();
    if (role == Qt::ToolTipRole) {
        const MetricDefinition d = metricDefinition(key);
        QString tip = QStringLiteral("<p>%1</p><p><i>%2</i></p>").arg(QString::fromUtf8(d.definition.data(), int(d.definition.size())),
                                                                  QString::fromUtf8(d.source.data(), int(d.source.size())));
        if (entry.estimate.lower)
            tip += tr("<p>Interval: %1</p>").arg(QString::fromStdString(ciMethodLabel(entry.estimate.ciMethod)));
        if (!entry.intervalNote.empty()) // why this interval and not the one asked for
            tip += QStringLiteral("<p>%1.</p>").arg(QString::fromStdString(entry.intervalNote).toHtmlEscaped());
        return tip;
    }
    return {};
}

QVariant MetricTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || !m_snapshot)
        return {};
    if (section == 0)
        return role == Qt::DisplayRole ? tr("Metric") : QVariant();
    const int model = (section - 1) / 2;
    const std::string& name = m_snapshot->validation.models[static_cast<std::size_t>(model)].name;
    if (role == Qt::DecorationRole && (section - 1) % 2 == 0)
        return modelColour(model);
    if (role != Qt::DisplayRole)
        return {};
    const double level = m_snapshot->validation.settings.confidence * 100.0;
    return (section - 1) % 2 == 0 ? tr("%1: estimate (%2 % CI)").arg(QString::fromStdString(name)).arg(level)
                                  : tr("%1: reading").arg(QString::fromStdString(name));
}

} // namespace plumbline
