using System.Text;

namespace Patchproof.Server.Apis;

/// <summary>Reads a small text document (a design, a calibration file) from a request body, refusing it past a size limit.</summary>
internal static class BoundedRequestBody
{
    /// <summary>The body as UTF-8 text without a byte-order mark, or null when it is longer than <paramref name="maxBytes"/>.</summary>
    /// <remarks>The declared length is checked first, and the count again while reading, so a body without a length
    /// (chunked) cannot grow past the limit in memory.</remarks>
    public static async Task<string?> ReadTextAsync(HttpRequest request, int maxBytes, CancellationToken cancellationToken)
    {
        if (request.ContentLength > maxBytes)
        {
            return null;
        }

        using var buffer = new MemoryStream();
        var chunk = new byte[81920];
        int read;
        while ((read = await request.Body.ReadAsync(chunk, cancellationToken)) > 0)
        {
            if (buffer.Length + read > maxBytes)
            {
                return null;
            }

            buffer.Write(chunk, 0, read);
        }

        return Encoding.UTF8.GetString(buffer.GetBuffer(), 0, (int)buffer.Length).TrimStart('\uFEFF');
    }
}
