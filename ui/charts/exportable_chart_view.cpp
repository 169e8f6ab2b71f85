#include "charts/exportable_chart_view.hpp"

#include "widgets/save_location.hpp"

#include <QApplication>
#include <QBuffer>
#include <QChart>
#include <QClipboard>
#include <QContextMenuEvent>
#include <QCursor>
#include <QFileInfo>
#include <QHelpEvent>
#include <QGraphicsLayout>
#include <QLegendMarker>
#include <QMenu>
#include <QMessageBox>
#include <QPainter>
#include <QSaveFile>
#include <QSvgGenerator>
#include <QToolTip>

#include <cmath>

namespace plumbline {

ExportableChartView::ExportableChartView(QWidget* parent)
    : QChartView(parent)
{
    setRenderHint(QPainter::Antialiasing);
    setContextMenuPolicy(Qt::DefaultContextMenu);
    setFocusPolicy(Qt::ClickFocus); // Edit → Copy chart copies the chart last clicked
}

// The chart laid out at an export size for the duration of `draw`: square if it is square in the
// window, but never aligned to another view (that alignment is in the window's coordinates).
template <typename Draw>
void ExportableChartView::laidOutAt(QSize size, Draw draw)
{
    QChart* c = chart();
    const QRectF original = c->geometry();
    const qreal left = m_alignLeft, right = m_alignRight;
    m_alignLeft = m_alignRight = -1.0;
    m_exporting = true;
    c->setGeometry(QRectF(QPointF(0, 0), size));
    fitPlotArea();
    if (!m_square)
        c->setMargins(m_baseMargins);
    draw();
    c->setGeometry(original);
    m_alignLeft = left;
    m_alignRight = right;
    m_exporting = false;
    c->setMargins(m_baseMargins);
    fitPlotArea();
}

void ExportableChartView::renderInto(QPainter* painter, const QRectF& target, QSize size)
{
    laidOutAt(size, [&] { scene()->render(painter, target, QRectF(QPointF(0, 0), size)); });
}

QByteArray ExportableChartView::svg(QSize size)
{
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    QSvgGenerator generator;
    generator.setOutputDevice(&buffer);
    generator.setSize(size);
    generator.setViewBox(QRect(QPoint(0, 0), size));
    generator.setResolution(96);
    generator.setTitle(chart()->title());
    {
        QPainter painter(&generator);
        renderInto(&painter, QRectF(QPointF(0, 0), size), size);
    }
    return bytes;
}

QImage ExportableChartView::image(QSize size)
{
    const qreal ratio = 2.0; // crisp on high-DPI screens and in documents
    QImage image(size * ratio, QImage::Format_ARGB32_Premultiplied);
    image.setDevicePixelRatio(ratio);
    image.fill(Qt::white);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    renderInto(&painter, QRectF(QPointF(0, 0), size), size);
    return image;
}

bool ExportableChartView::exportTo(const QString& path, QSize size, QString* error)
{
    QByteArray bytes;
    if (QFileInfo(path).suffix().compare(QStringLiteral("svg"), Qt::CaseInsensitive) == 0) {
        bytes = svg(size);
    } else {
        QBuffer buffer(&bytes);
        buffer.open(QIODevice::WriteOnly);
        image(size).save(&buffer, "PNG");
    }
    // Written under a temporary name and renamed: a failed export never leaves half a file.
    QSaveFile file(path);
    if (!file.open(QIODevice::WriteOnly) || file.write(bytes) != bytes.size() || !file.commit()) {
        if (error)
            *error = file.errorString();
        return false;
    }
    return true;
}

void ExportableChartView::copyToClipboard()
{
    QApplication::clipboard()->setImage(image(size().expandedTo(QSize(400, 300))));
}

QString ExportableChartView::suggestedFileName() const
{
    if (!objectName().isEmpty())
        return objectName();
    // From the title: "C statistic by level" → "c-statistic-by-level".
    QString slug;
    for (const QChar ch : chart()->title().toLower())
        slug += ch.isLetterOrNumber() ? ch : QLatin1Char('-');
    while (slug.contains(QStringLiteral("--")))
        slug.replace(QStringLiteral("--"), QStringLiteral("-"));
    slug = slug.section(QLatin1Char('-'), 0, -1, QString::SectionSkipEmpty);
    return slug.isEmpty() ? QStringLiteral("chart") : slug;
}

void ExportableChartView::setSquarePlot(bool square)
{
    m_square = square;
    fitPlotArea();
}

void ExportableChartView::alignPlotEdges(qreal left, qreal right)
{
    m_alignLeft = left;
    m_alignRight = right;
    fitPlotArea();
}

void ExportableChartView::fitPlotArea()
{
    QChart* c = chart();
    if (!c || (!m_square && m_alignLeft < 0.0))
        return;
    c->setMargins(m_baseMargins);
    c->layout()->activate();
    const QRectF natural = c->plotArea();
    QMargins fitted = m_baseMargins;
    if (m_alignLeft >= 0.0) {
        fitted.setLeft(fitted.left() + std::max(0, int(std::lround(m_alignLeft - natural.left()))));
        fitted.setRight(fitted.right() + std::max(0, int(std::lround(natural.right() - m_alignRight))));
    } else {
        const qreal excess = natural.width() - natural.height();
        const int half = int(std::floor(std::abs(excess) / 2.0)), rest = int(std::ceil(std::abs(excess) / 2.0));
        if (excess > 0.0) {
            fitted.setLeft(fitted.left() + half);
            fitted.setRight(fitted.right() + rest);
        } else {
            fitted.setTop(fitted.top() + half);
            fitted.setBottom(fitted.bottom() + rest);
        }
    }
    if (fitted != m_baseMargins) {
        c->setMargins(fitted);
        c->layout()->activate();
    }
    if (!m_exporting)
        emit plotAreaFitted(mapFromScene(c->mapToScene(c->plotArea())).boundingRect());
}

void ExportableChartView::resizeEvent(QResizeEvent* event)
{
    QChartView::resizeEvent(event);
    fitPlotArea();
}

void ExportableChartView::resetChart()
{
    QChart* c = chart();
    c->removeAllSeries();
    for (QAbstractAxis* axis : c->axes()) {
        c->removeAxis(axis);
        delete axis;
    }
    m_unlisted.clear();
}

void ExportableChartView::keepOutOfLegend(QAbstractSeries* series)
{
    m_unlisted.insert(series);
    applyLegendRules();
}

void ExportableChartView::setSeriesVisible(QAbstractSeries* series, bool visible)
{
    if (!series)
        return;
    series->setVisible(visible);
    applyLegendRules();
}

void ExportableChartView::applyLegendRules()
{
    for (QLegendMarker* marker : chart()->legend()->markers())
        if (m_unlisted.contains(marker->series()) || marker->label().isEmpty())
            marker->setVisible(false);
}

QStringList ExportableChartView::legendEntries() const
{
    QStringList out;
    for (QLegendMarker* marker : chart()->legend()->markers())
        if (marker->isVisible())
            out << marker->label();
    return out;
}

void ExportableChartView::showValueTip(const QString& text)
{
    m_valueTip = text;
    QToolTip::showText(QCursor::pos(), text, viewport());
}

void ExportableChartView::hideValueTip()
{
    m_valueTip.clear();
    QToolTip::hideText();
}

bool ExportableChartView::viewportEvent(QEvent* event)
{
    if (event->type() == QEvent::ToolTip && !m_valueTip.isEmpty()) {
        QToolTip::showText(static_cast<QHelpEvent*>(event)->globalPos(), m_valueTip, viewport());
        return true;
    }
    return QChartView::viewportEvent(event);
}

void ExportableChartView::contextMenuEvent(QContextMenuEvent* event)
{
    QMenu menu(this);
    QAction* copy = menu.addAction(tr("&Copy chart"));
    QAction* png = menu.addAction(tr("Save chart as &PNG…"));
    QAction* svgAction = menu.addAction(tr("Save chart as &SVG…"));
    QAction* chosen = menu.exec(event->globalPos());
    if (!chosen)
        return;
    if (chosen == copy) {
        copyToClipboard();
        emit exported(tr("Chart copied: %1").arg(chart()->title().isEmpty() ? accessibleName() : chart()->title()));
        return;
    }
    const bool asSvg = chosen == svgAction;
    const QString path = askSaveLocation(this, chosen->text().remove(QLatin1Char('&')), suggestedFileName(),
                                         {asSvg ? FileKind{tr("SVG image"), QStringLiteral("svg")} : FileKind{tr("PNG image"), QStringLiteral("png")}});
    if (path.isEmpty())
        return;
    QString error;
    if (!exportTo(path, QSize(900, 700), &error))
        QMessageBox::warning(this, tr("Chart not saved"), tr("%1 could not be written: %2").arg(path, error));
    else
        emit exported(tr("Chart saved to %1").arg(path));
    (void)png;
}

} // namespace plumbline
