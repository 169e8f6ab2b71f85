#pragma once

#include <QByteArray>
#include <QChartView>

class QPainter;
#include <QSize>
#include <QString>

namespace plumbline {

// A chart view whose context menu saves the chart as PNG or SVG at a fixed size, independent of
// the window (the scene is rendered with the chart laid out at the export size).
class ExportableChartView : public QChartView {
    Q_OBJECT
public:
    explicit ExportableChartView(QWidget* parent = nullptr);

    // Writes PNG or SVG by the file's suffix; false with a reason when it cannot.
    bool exportTo(const QString& path, QSize size, QString* error = nullptr);
    // The chart laid out at `size` and drawn into `target` of any painter (vector in PDF and SVG).
    void renderInto(QPainter* painter, const QRectF& target, QSize size);
    // The chart as a standalone SVG document.
    QByteArray svg(QSize size);

protected:
    void contextMenuEvent(QContextMenuEvent* event) override;
};

} // namespace plumbline
