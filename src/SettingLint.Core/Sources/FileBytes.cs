namespace SettingLint.Core.Sources;

/// <summary>Bytes of a file copied into a caller's buffer, as <see cref="IFileSource.ReadInto"/> returns them.</summary>
internal static class FileBytes
{
    /// <summary>Copies the bytes into the buffer (made larger when too small) unless they are longer than <paramref name="maxBytes"/>; returns their length, -1 for none.</summary>
    public static long CopyInto(byte[]? bytes, long maxBytes, ref byte[] buffer)
    {
        if (bytes is null) return -1;
        if (bytes.LongLength > maxBytes) return bytes.LongLength;
        if (buffer.Length < bytes.Length) buffer = new byte[bytes.Length];
        bytes.CopyTo(buffer, 0);
        return bytes.Length;
    }

    /// <summary>
    /// Reads a file on disk into the buffer through one open, without the check that the file exists and without a new
    /// array per file; -1 when it is not there.
    /// </summary>
    public static long ReadInto(string fullPath, long maxBytes, ref byte[] buffer)
    {
        Microsoft.Win32.SafeHandles.SafeFileHandle handle;
        try
        {
            handle = File.OpenHandle(fullPath);
        }
        catch (Exception ex) when (ex is FileNotFoundException or DirectoryNotFoundException)
        {
            return -1;
        }
        using (handle)
        {
            var length = RandomAccess.GetLength(handle);
            if (length > maxBytes) return length;
            if (buffer.Length < length) buffer = new byte[length];
            // As File.ReadAllBytes: the length found on opening, or less when the file shrank meanwhile.
            var read = 0;
            while (read < length)
            {
                var n = RandomAccess.Read(handle, buffer.AsSpan(read, (int)length - read), read);
                if (n == 0) break;
                read += n;
            }
            return read;
        }
    }
}
