#pragma once

#include "analyses/site_pooling.hpp"
#include "charts/exportable_chart_view.hpp"

#include <optional>

namespace plumbline {

// A forest chart of one measure across sites: each site's estimate with its interval, the
// pooled value as a diamond spanning its HKSJ interval, and beneath it the prediction interval
// for a new site as a bar; an optional reference line (O/E = 1, slope = 1).
class SiteForestView : public ExportableChartView {
    Q_OBJECT
public:
    explicit SiteForestView(const QString& title, const QString& axisTitle, QWidget* parent = nullptr);

    // Draws nothing for a measure that was not pooled (no pool) apart from its sites.
    void setMeasure(const PooledMeasure& measure, std::optional<double> reference, int modelIndex);
    void clear();
    // The rows' labels from the top, as drawn (tests compare them with the result).
    const QStringList& rowLabels() const { return m_labels; }

private:
    QString m_axisTitle;
    QStringList m_labels;
};

} // namespace plumbline
