#include "widgets/save_location.hpp"

#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QSettings>
#include <QStandardPaths>

namespace plumbline {

namespace {

QString keyOf(FolderUse use)
{
    return use == FolderUse::Reading ? QStringLiteral("paths/lastReadFolder") : QStringLiteral("paths/lastWriteFolder");
}

QString filterOf(const FileKind& kind)
{
    return QStringLiteral("%1 (*.%2)").arg(kind.label, kind.suffix);
}

} // namespace

QString lastFolder(FolderUse use)
{
    const QString folder = QSettings().value(keyOf(use)).toString();
    if (!folder.isEmpty() && QFileInfo(folder).isDir())
        return folder;
    const QString documents = QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation);
    return use == FolderUse::Writing && QFileInfo(documents).isDir() ? documents : QDir::homePath();
}

void rememberFolderOf(const QString& path, FolderUse use)
{
    const QFileInfo info(path);
    QSettings().setValue(keyOf(use), info.isDir() ? info.absoluteFilePath() : info.absolutePath());
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
    const QString start = QDir(lastFolder(FolderUse::Writing)).filePath(kinds.isEmpty() ? suggestedName : suggestedName + QLatin1Char('.') + kinds.front().suffix);
    QString chosenFilter;
    const QString path = QFileDialog::getSaveFileName(parent, title, start, filters.join(QStringLiteral(";;")), &chosenFilter);
    if (path.isEmpty())
        return {};
    const QString complete = withSuffix(path, kinds, chosenFilter);
    rememberFolderOf(complete, FolderUse::Writing);
    return complete;
}

QString askFolder(QWidget* parent, const QString& title)
{
    const QString folder = QFileDialog::getExistingDirectory(parent, title, lastFolder(FolderUse::Writing));
    if (!folder.isEmpty())
        rememberFolderOf(folder, FolderUse::Writing);
    return folder;
}

QString askOpenLocation(QWidget* parent, const QString& title, const QString& filter)
{
    const QString path = QFileDialog::getOpenFileName(parent, title, lastFolder(FolderUse::Reading), filter);
    if (!path.isEmpty())
        rememberFolderOf(path, FolderUse::Reading);
    return path;
}

} // namespace plumbline
