namespace LaunchLogger.Decoding.Analysis;

/// <summary>A run could not be analysed; the message says which run and why, in one line.</summary>
public sealed class AnalysisException : Exception
{
    /// <summary>Creates the exception.</summary>
    public AnalysisException(string message, Exception? inner = null)
        : base(message, inner)
    {
    }
}
