#include "models/threshold_summary_model.hpp"

#include "charts/model_palette.hpp"
#include "charts/roc_chart_view.hpp"
#include "reporting/value_text.hpp"

#include <QColor>
#include <QLocale>

namespace plumbline {

ThresholdSummaryModel::ThresholdSummaryModel(QObject* parent)
    : QAbstractTableModel(parent)
{
}

void ThresholdSummaryModel::setSnapshot(SnapshotPointer snapshot)
{
    beginResetModel();
    m_snapshot = std::move(snapshot);
    endResetModel();
}

void ThresholdSummaryModel::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (rowCount() > 0)
        emit dataChanged(index(0, 0), index(rowCount() - 1, ColumnCount - 1));
}

int ThresholdSummaryModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_snapshot || m_snapshot->validation.models.empty()
        ? 0
        : static_cast<int>(m_snapshot->validation.models.size()) + 1;
}

int ThresholdSummaryModel::treatAllRow() const
{
    return m_snapshot && !m_snapshot->validation.models.empty() ? static_cast<int>(m_snapshot->validation.models.size()) : -1;
}

int ThresholdSummaryModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant ThresholdSummaryModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || !m_snapshot)
        return {};
    const bool everyone = index.row() == treatAllRow();
    const ModelValidation& model = m_snapshot->validation.models[everyone ? 0 : static_cast<std::size_t>(index.row())];
    const QString name = everyone ? tr("Treat all") : QString::fromStdString(model.name);
    if (role == Qt::DecorationRole && index.column() == ModelColumn && !everyone)
        return modelColour(index.row());
    if (role == Qt::TextAlignmentRole && index.column() != ModelColumn)
        return QVariant::fromValue(Qt::Alignment(Qt::AlignRight | Qt::AlignVCenter));
    if (role == Qt::ForegroundRole && everyone)
        return QColor(90, 90, 90);
    if ((role != Qt::DisplayRole && role != Qt::UserRole && role != Qt::ToolTipRole) || model.operatingPoints.empty())
        return index.column() == ModelColumn && role == Qt::DisplayRole ? name : QVariant();
    const OperatingPoint& modelPoint = model.operatingPoints[std::min(operatingPointIndex(m_threshold), model.operatingPoints.size() - 1)];
    const OperatingPoint p = everyone ? treatAll(modelPoint) : modelPoint;
    if (role == Qt::ToolTipRole) // the whole 2×2 table, also when a narrow window hides TN and FN
        return tr("%1 at threshold %2: flagged with the event (TP) %3, flagged without (FP) %4, not flagged without (TN) %5, "
                  "missed (FN) %6")
            .arg(everyone ? tr("Flagging everyone") : name)
            .arg(m_threshold, 0, 'f', 3)
            .arg(QLocale().toString(qulonglong(p.tp)), QLocale().toString(qulonglong(p.fp)), QLocale().toString(qulonglong(p.tn)),
                 QLocale().toString(qulonglong(p.fn)));
    const OperatingPointSummary s = summarise(p);
    const bool raw = role == Qt::UserRole; // tests read the numbers, people the formatted text
    auto count = [&](std::size_t n) -> QVariant { return raw ? QVariant(qulonglong(n)) : QLocale().toString(qulonglong(n)); };
    auto share = [&](const std::optional<double>& v) -> QVariant {
        if (!v)
            return raw ? QVariant() : QStringLiteral("–");
        return raw ? QVariant(*v) : QString::fromStdString(fixedText(*v, 3));
    };
    switch (index.column()) {
    case ModelColumn: return name;
    case TpColumn: return count(p.tp);
    case FpColumn: return count(p.fp);
    case TnColumn: return count(p.tn);
    case FnColumn: return count(p.fn);
    case SensitivityColumn: return share(s.sensitivity);
    case SpecificityColumn: return share(s.specificity);
    case PpvColumn: return share(s.ppv);
    case NpvColumn: return share(s.npv);
    case FlagRateColumn: return share(s.flagRate);
    case NetBenefitColumn: return raw ? QVariant(s.netBenefit) : QVariant(QString::fromStdString(fixedText(s.netBenefit, 4)));
    default: return {};
    }
}

QVariant ThresholdSummaryModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal)
        return {};
    if (role == Qt::ToolTipRole) {
        switch (section) {
        case TpColumn: return tr("Flagged patients with the event (risk ≥ threshold)");
        case FpColumn: return tr("Flagged patients without the event");
        case TnColumn: return tr("Not flagged, without the event");
        case FnColumn: return tr("Not flagged, with the event (missed)");
        case FlagRateColumn: return tr("Share of all patients flagged: the workload");
        case NetBenefitColumn: return tr("TP/N − FP/N · t/(1−t) (Vickers & Elkin 2006)");
        default: return {};
        }
    }
    if (role != Qt::DisplayRole)
        return {};
    static const char* names[] = {QT_TR_NOOP("Model"), "TP", "FP", "TN", "FN", QT_TR_NOOP("Sensitivity"),
                                  QT_TR_NOOP("Specificity"), "PPV", "NPV", QT_TR_NOOP("Flagged"),
                                  QT_TR_NOOP("Net benefit")};
    return section >= 0 && section < ColumnCount ? tr(names[section]) : QVariant();
}

} // namespace plumbline
