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

// Asks where to save, starting in the folder last written to with a suggested name; a name typed
// without a known suffix gets the suffix of the chosen kind (never a refusal). Empty when the
// user cancels.
QString askSaveLocation(QWidget* parent, const QString& title, const QString& suggestedName, const QList<FileKind>& kinds);
// Asks for a folder to write into, starting in the folder last written to.
QString askFolder(QWidget* parent, const QString& title);
// Asks for a file to open, starting in the folder last read from.
QString askOpenLocation(QWidget* parent, const QString& title, const QString& filter);

// Files are read from one place and results written to another: the folder last read from
// (the home folder at first) and the folder last written to (the documents folder at first,
// never the data's folder by default).
enum class FolderUse { Reading, Writing };
QString lastFolder(FolderUse use);
void rememberFolderOf(const QString& path, FolderUse use);

// `path` with the suffix of the kind whose label is `filterLabel` added when it has none of
// the kinds' suffixes.
QString withSuffix(const QString& path, const QList<FileKind>& kinds, const QString& chosenFilter);

} // namespace plumbline
