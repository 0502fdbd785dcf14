using System.Globalization;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>One NMEA 0183 sentence, split into its fields, its checksum verified.</summary>
/// <remarks>NMEA 0183: a sentence is <c>$</c>, an address field (a two-letter talker and a
/// three-letter sentence type, e.g. <c>GPRMC</c>, <c>GNVTG</c>), comma-separated data fields, then
/// <c>*hh</c>, the exclusive-or of every character between <c>$</c> and <c>*</c> as two hex
/// digits. A sentence without a checksum, or whose checksum disagrees, is refused.</remarks>
public sealed class NmeaSentence
{
    private NmeaSentence(string talker, string type, string[] fields)
    {
        Talker = talker;
        Type = type;
        Fields = fields;
    }

    /// <summary>The talker, e.g. GP (GPS), GN (several systems).</summary>
    public string Talker { get; }

    /// <summary>The sentence type, e.g. RMC, VTG, GGA.</summary>
    public string Type { get; }

    /// <summary>The data fields after the address; <c>Fields[0]</c> is the sentence's field 1.</summary>
    public string[] Fields { get; }

    /// <summary>The field numbered as the standard numbers them (1-based), or "" past the end.</summary>
    public string Field(int number) => number >= 1 && number <= Fields.Length ? Fields[number - 1] : string.Empty;

    /// <summary>The checksum of a sentence body (the characters between <c>$</c> and <c>*</c>).</summary>
    public static byte Checksum(ReadOnlySpan<char> body)
    {
        byte sum = 0;
        foreach (char c in body)
        {
            sum ^= (byte)c;
        }

        return sum;
    }

    /// <summary>Parses one line; false when it is not a sentence or its checksum is absent or wrong.</summary>
    public static bool TryParse(string line, out NmeaSentence? sentence)
    {
        sentence = null;
        ReadOnlySpan<char> text = line.AsSpan().Trim();
        int dollar = text.IndexOf('$');
        if (dollar < 0)
        {
            return false;
        }

        text = text[(dollar + 1)..];
        int star = text.LastIndexOf('*');
        if (star < 0 || text.Length < star + 3)
        {
            return false;
        }

        ReadOnlySpan<char> body = text[..star];
        if (!byte.TryParse(text.Slice(star + 1, 2), NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture, out byte stated)
            || stated != Checksum(body))
        {
            return false;
        }

        string[] parts = body.ToString().Split(',');
        string address = parts[0];
        if (address.Length < 5)
        {
            return false;
        }

        sentence = new NmeaSentence(address[..^3], address[^3..], parts[1..]);
        return true;
    }
}
