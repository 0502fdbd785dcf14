using System.Globalization;

namespace LaunchLogger.Decoding.Import;

/// <summary>Input a user gave is unusable: a missing file, a wrong header, a cell that is not a
/// number, time going backwards, too few rows, options that do not fit together. The message is
/// one line naming the file (or option) and the line, ready to show as it is.</summary>
public sealed class InputException : Exception
{
    /// <summary>Creates the exception.</summary>
    /// <param name="file">The file as the user named it, or the command-line option at fault.</param>
    /// <param name="line">The 1-based line, or 0 when the problem is not on one line.</param>
    /// <param name="detail">What is wrong, one line, no location.</param>
    /// <param name="inner">The underlying error, if any.</param>
    public InputException(string file, int line, string detail, Exception? inner = null)
        : base(Compose(file, line, detail), inner)
    {
        File = file;
        Line = line;
        Detail = detail;
    }

    /// <summary>The file as the user named it, or the command-line option at fault.</summary>
    public string File { get; }

    /// <summary>The 1-based line, or 0 when the problem is not on one line.</summary>
    public int Line { get; }

    /// <summary>What is wrong, without the location.</summary>
    public string Detail { get; }

    private static string Compose(string file, int line, string detail) => line > 0
        ? string.Create(CultureInfo.InvariantCulture, $"{file}:{line}: {detail}")
        : $"{file}: {detail}";
}
