#include "save_location.hpp"

#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QSettings>

namespace plumbline {

namespace {

const QString folderKey = QStringLiteral("paths/lastFolder");

QString filterOf(const FileKind& kind)
{
    return QStringLiteral("%1 (*.%2)").arg(kind.label, kind.suffix);
}

} // namespace

QString lastFolder()
{
    const QString folder = QSettings().value(folderKey).toString();
    return !folder.isEmpty() && QFileInfo(folder).isDir() ? folder : QDir::homePath();
}

void rememberFolderOf(const QString& path)
{
    const QFileInfo info(path);
    QSettings().setValue(folderKey, info.isDir() ? info.absoluteFilePath() : info.absolutePath());
}

QString withSuffix(const QString& path, const QList<FileKind>& kinds, const QString& chosenFilter)
{
    for (const FileKind& kind : kinds)
        if (path.endsWith(QLatin1Char('.') + kind.suffix, Qt::CaseInsensitive))
            return path;
    for (const FileKind& kind : kinds)
        if (chosenFilter == filterOf(kind))
            return path + QLatin1Char('.') + kind.suffix;
    return kinds.isEmpty() ? path : path + QLatin1Char('.') + kinds.front().suffix;
}

QString askSaveLocation(QWidget* parent, const QString& title, const QString& suggestedName, const QList<FileKind>& kinds)
{
    QStringList filters;
    for (const FileKind& kind : kinds)
        filters << filterOf(kind);
    const QString start = QDir(lastFolder()).filePath(kinds.isEmpty() ? suggestedName : suggestedName + QLatin1Char('.') + kinds.front().suffix);
    QString chosenFilter;
    const QString path = QFileDialog::getSaveFileName(parent, title, start, filters.join(QStringLiteral(";;")), &chosenFilter);
    if (path.isEmpty())
        return {};
    const QString complete = withSuffix(path, kinds, chosenFilter);
    rememberFolderOf(complete);
    return complete;
}

QString askFolder(QWidget* parent, const QString& title)
{
    const QString folder = QFileDialog::getExistingDirectory(parent, title, lastFolder());
    if (!folder.isEmpty())
        rememberFolderOf(folder);
    return folder;
}

QString askOpenLocation(QWidget* parent, const QString& title, const QString& filter)
{
    const QString path = QFileDialog::getOpenFileName(parent, title, lastFolder(), filter);
    if (!path.isEmpty())
        rememberFolderOf(path);
    return path;
}

} // namespace plumbline
