#include "exportable_chart_view.hpp"

#include <QContextMenuEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QImage>
#include <QMenu>
#include <QMessageBox>
#include <QPainter>
#include <QSaveFile>
#include <QSvgGenerator>
#include <QBuffer>

namespace plumbline {

ExportableChartView::ExportableChartView(QWidget* parent)
    : QChartView(parent)
{
    setRenderHint(QPainter::Antialiasing);
    setContextMenuPolicy(Qt::DefaultContextMenu);
}

bool ExportableChartView::exportTo(const QString& path, QSize size, QString* error)
{
    QChart* chart = this->chart();
    const QRectF original = chart->geometry();
    chart->setGeometry(QRectF(QPointF(0, 0), size));
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    const bool svg = QFileInfo(path).suffix().compare(QStringLiteral("svg"), Qt::CaseInsensitive) == 0;
    if (svg) {
        QSvgGenerator generator;
        generator.setOutputDevice(&buffer);
        generator.setSize(size);
        generator.setViewBox(QRect(QPoint(0, 0), size));
        generator.setResolution(96);
        generator.setTitle(chart->title());
        QPainter painter(&generator);
        scene()->render(&painter, QRectF(QPointF(0, 0), size), QRectF(QPointF(0, 0), size));
    } else {
        const qreal ratio = 2.0; // crisp on high-DPI screens and in documents
        QImage image(size * ratio, QImage::Format_ARGB32_Premultiplied);
        image.setDevicePixelRatio(ratio);
        image.fill(Qt::white);
        {
            QPainter painter(&image);
            painter.setRenderHint(QPainter::Antialiasing);
            scene()->render(&painter, QRectF(QPointF(0, 0), size), QRectF(QPointF(0, 0), size));
        }
        image.save(&buffer, "PNG");
    }
    chart->setGeometry(original);
    // Written under a temporary name and renamed: a failed export never leaves half a file.
    QSaveFile file(path);
    if (!file.open(QIODevice::WriteOnly) || file.write(bytes) != bytes.size() || !file.commit()) {
        if (error)
            *error = file.errorString();
        return false;
    }
    return true;
}

void ExportableChartView::renderInto(QPainter* painter, const QRectF& target, QSize size)
{
    QChart* chart = this->chart();
    const QRectF original = chart->geometry();
    chart->setGeometry(QRectF(QPointF(0, 0), size));
    scene()->render(painter, target, QRectF(QPointF(0, 0), size));
    chart->setGeometry(original);
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

void ExportableChartView::contextMenuEvent(QContextMenuEvent* event)
{
    QMenu menu(this);
    QAction* png = menu.addAction(tr("Save chart as PNG…"));
    QAction* svg = menu.addAction(tr("Save chart as SVG…"));
    QAction* chosen = menu.exec(event->globalPos());
    if (!chosen)
        return;
    const bool asSvg = chosen == svg;
    const QString path = QFileDialog::getSaveFileName(this, chosen->text(), QString(),
                                                      asSvg ? tr("SVG image (*.svg)") : tr("PNG image (*.png)"));
    if (path.isEmpty())
        return;
    QString error;
    if (!exportTo(path, QSize(900, 700), &error))
        QMessageBox::warning(this, tr("Chart not saved"), tr("%1 could not be written: %2").arg(path, error));
    (void)png;
}

} // namespace plumbline
