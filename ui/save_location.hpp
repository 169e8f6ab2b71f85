#pragma once

#include <QList>
#include <QString>

class QWidget;

namespace plumbline {

// A kind of file the user may save: "PDF report", "pdf".
struct FileKind {
    QString label;
    QString suffix;
};

// Asks where to save, starting in the folder used last with a suggested name; a name typed
// without a known suffix gets the suffix of the chosen kind (never a refusal). Empty when the
// user cancels.
QString askSaveLocation(QWidget* parent, const QString& title, const QString& suggestedName, const QList<FileKind>& kinds);
// Asks for a folder, starting in the folder used last.
QString askFolder(QWidget* parent, const QString& title);
// Asks for a file to open, starting in the folder used last.
QString askOpenLocation(QWidget* parent, const QString& title, const QString& filter);

// The folder of the last file opened or saved (the user's home folder at first).
QString lastFolder();
void rememberFolderOf(const QString& path);

// `path` with the suffix of the kind whose label is `filterLabel` added when it has none of
// the kinds' suffixes.
QString withSuffix(const QString& path, const QList<FileKind>& kinds, const QString& chosenFilter);

} // namespace plumbline
