#pragma once

#include <QByteArray>
#include <QChartView>
#include <QImage>
#include <QMargins>
#include <QSet>
#include <QSize>
#include <QString>

class QAbstractSeries;
class QPainter;

namespace plumbline {

// A chart view whose context menu copies the chart to the clipboard or saves it as PNG or SVG
// at a fixed size, independent of the window (the scene is rendered with the chart laid out at
// the export size). It can keep its plot area square (calibration and ROC: the ideal line at
// 45°) or line its plot area up with another chart's, and it keeps chosen series out of the
// legend whatever their visibility.
class ExportableChartView : public QChartView {
    Q_OBJECT
public:
    explicit ExportableChartView(QWidget* parent = nullptr);

    // Writes PNG or SVG by the file's suffix; false with a reason when it cannot.
    bool exportTo(const QString& path, QSize size, QString* error = nullptr);
    // The chart laid out at `size` and drawn into `target` of any painter (vector in PDF and SVG).
    void renderInto(QPainter* painter, const QRectF& target, QSize size);
    // The chart as a standalone SVG document, or as an image (twice the size, for high DPI).
    QByteArray svg(QSize size);
    QImage image(QSize size);
    // The chart as the window shows it, to the clipboard.
    void copyToClipboard();
    // A file name to offer when saving ("roc-curve"), from the view's object name.
    QString suggestedFileName() const;

    // The margins absorb any excess width or height so that the plot area stays square.
    void setSquarePlot(bool square);
    // The plot area's left and right edges at these x positions of the view (a chart stacked
    // under another shares its x axis); a negative `left` stops the alignment.
    void alignPlotEdges(qreal left, qreal right);

    // Series never listed in the legend; setSeriesVisible keeps them out when they reappear
    // (Qt shows every marker of a series again when the series is shown).
    void keepOutOfLegend(QAbstractSeries* series);
    void setSeriesVisible(QAbstractSeries* series, bool visible);
    // The labels the legend shows now, in order (tests compare them).
    QStringList legendEntries() const;

signals:
    // The plot area after fitting (square or aligned), in view coordinates.
    void plotAreaFitted(const QRectF& area);
    // The chart was copied or saved from its context menu: what happened, for the status bar.
    void exported(const QString& message);

protected:
    void contextMenuEvent(QContextMenuEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;
    // Clears the chart for a new snapshot (series, axes and the legend rules).
    void resetChart();
    // Re-fits the plot area after the chart's content changed (new series, a longer legend).
    void fitPlotArea();
    // A tooltip with a value under the mouse (hovered points and lines), kept until the mouse
    // leaves the point: the scene's own tooltip handling would otherwise hide it at once.
    void showValueTip(const QString& text);
    void hideValueTip();
    bool viewportEvent(QEvent* event) override;

private:
    template <typename Draw>
    void laidOutAt(QSize size, Draw draw);
    void applyLegendRules();

    QSet<QAbstractSeries*> m_unlisted;
    QMargins m_baseMargins{4, 4, 4, 4};
    bool m_square = false;
    qreal m_alignLeft = -1.0, m_alignRight = -1.0;
    bool m_exporting = false;
    QString m_valueTip;
};

} // namespace plumbline
