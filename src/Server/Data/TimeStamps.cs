namespace Patchproof.Server.Data;

/// <summary>Converts between the stored Unix milliseconds and <see cref="DateTimeOffset"/> (UTC).</summary>
internal static class TimeStamps
{
    public static long ToUnixMs(DateTimeOffset time) => time.ToUnixTimeMilliseconds();

    public static DateTimeOffset FromUnixMs(long unixMs) => DateTimeOffset.FromUnixTimeMilliseconds(unixMs);

    public static DateTimeOffset? FromUnixMs(long? unixMs) => unixMs is { } value ? FromUnixMs(value) : null;
}
