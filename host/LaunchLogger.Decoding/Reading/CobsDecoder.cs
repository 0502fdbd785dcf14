using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>Undoes Consistent Overhead Byte Stuffing (Cheshire &amp; Baker, 1997) over spans, in
/// the form the log uses (LOG-FORMAT.md, section 1; the writer is <see cref="Cobs"/>).</summary>
/// <remarks>A code byte <c>c</c> is followed by <c>c − 1</c> data bytes and, unless
/// <c>c = FF</c> or the input ends there, an implied zero. A trailing <c>01</c> after a final
/// <c>FF</c> block (the paper's own encoder's form) decodes to nothing, so both forms are read.
/// Built for speed: one block copy per frame and a walk along its code bytes.</remarks>
public static class CobsDecoder
{
    /// <summary>Decodes one stuffed frame (without its delimiter) into <paramref name="destination"/>.</summary>
    /// <returns>False when the input holds a zero, a code byte runs past its end, or the payload
    /// does not fit in <paramref name="destination"/>.</returns>
    public static bool TryDecode(ReadOnlySpan<byte> stuffed, Span<byte> destination, out int written)
    {
        if (stuffed.Contains(LogFormat.Delimiter))
        {
            written = 0;
            return false;
        }

        return TryDecodeNonZero(stuffed, destination, out written);
    }

    /// <summary>As <see cref="TryDecode"/> for input the caller knows to be free of zeros (it
    /// was cut at the first delimiter).</summary>
    internal static bool TryDecodeNonZero(ReadOnlySpan<byte> stuffed, Span<byte> destination, out int written)
    {
        // Fast path for frames without a full 254-byte block (nearly all of them): the payload is
        // the stuffed bytes moved down by one with every later code byte turned into its zero, so
        // one block copy and a walk along the code chain do it, however short the blocks are.
        int length = stuffed.Length;
        if (length == 0 || length - 1 > destination.Length)
        {
            return TryDecodeBlocks(stuffed, destination, out written);
        }

        int next = stuffed[0];
        if (next == 0xFF)
        {
            return TryDecodeBlocks(stuffed, destination, out written);
        }

        stuffed[1..].CopyTo(destination);
        while (next < length)
        {
            int code = stuffed[next];
            if (code == 0xFF)
            {
                return TryDecodeBlocks(stuffed, destination, out written);
            }

            destination[next - 1] = 0;
            next += code;
        }

        written = length - 1;
        if (next != length)
        {
            // The last code byte promised more bytes than the frame holds.
            written = 0;
            return false;
        }

        return true;
    }

    /// <summary>Block by block, for any stuffing (full blocks, the trailing 01 form).</summary>
    private static bool TryDecodeBlocks(ReadOnlySpan<byte> stuffed, Span<byte> destination, out int written)
    {
        int read = 0;
        int write = 0;
        int length = stuffed.Length;
        while (read < length)
        {
            int code = stuffed[read];
            int blockEnd = read + code;
            int dataBytes = code - 1;
            if (blockEnd > length || write + dataBytes > destination.Length)
            {
                written = 0;
                return false;
            }

            stuffed.Slice(read + 1, dataBytes).CopyTo(destination.Slice(write));
            write += dataBytes;
            read = blockEnd;
            if (code != 0xFF && read < length)
            {
                if (write >= destination.Length)
                {
                    written = 0;
                    return false;
                }

                destination[write++] = 0;
            }
        }

        written = write;
        return true;
    }
}
