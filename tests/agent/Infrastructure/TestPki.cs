using System.Net;
using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// A certificate authority made for one test with System.Security.Cryptography, writing PEM files to a temp folder:
/// the CA certificate and the certificates it issues (server for 127.0.0.1/localhost, or client), each with its key.
/// </summary>
public sealed class TestPki : IDisposable
{
    private readonly ECDsa _caKey;
    private readonly X509Certificate2 _ca;
    private long _serial = 1;

    private TestPki(string dir, string name)
    {
        Dir = dir;
        _caKey = ECDsa.Create(ECCurve.NamedCurves.nistP256);
        var request = new CertificateRequest($"CN={name}, O=Quillmoor Works", _caKey, HashAlgorithmName.SHA256);
        request.CertificateExtensions.Add(new X509BasicConstraintsExtension(true, false, 0, true));
        request.CertificateExtensions.Add(new X509KeyUsageExtension(X509KeyUsageFlags.KeyCertSign | X509KeyUsageFlags.CrlSign, true));
        request.CertificateExtensions.Add(new X509SubjectKeyIdentifierExtension(request.PublicKey, false));
        var now = TimeProvider.System.GetUtcNow();
        _ca = request.CreateSelfSigned(now.AddDays(-1), now.AddDays(2));
        CaFile = Path.Combine(dir, $"{Slug(name)}-ca.pem");
        File.WriteAllText(CaFile, _ca.ExportCertificatePem());
    }

    public string Dir { get; }

    /// <summary>The CA certificate (PEM) to trust.</summary>
    public string CaFile { get; }

    /// <summary>A new CA; files go to a fresh temp folder readable by the mosquitto user.</summary>
    public static TestPki Create(string name)
    {
        var dir = Directory.CreateTempSubdirectory("lw-pki-").FullName;
        // Started as root, mosquitto drops to its own user, which must read the files here.
        if (!OperatingSystem.IsWindows()) File.SetUnixFileMode(dir, (UnixFileMode)0b111_101_101);
        return new TestPki(dir, name);
    }

    /// <summary>A server certificate; by default for localhost and 127.0.0.1, else for <paramref name="dnsNames"/> only.</summary>
    public IssuedCertificate IssueServer(string name, params string[] dnsNames) =>
        Issue(name, "1.3.6.1.5.5.7.3.1", dnsNames.Length > 0 ? dnsNames : ["localhost"], dnsNames.Length == 0, null);

    /// <summary>A client certificate for mutual TLS; with <paramref name="keyPassword"/> its key file is encrypted (PKCS#8).</summary>
    public IssuedCertificate IssueClient(string name, string? keyPassword = null) => Issue(name, "1.3.6.1.5.5.7.3.2", [], false, keyPassword);

    private IssuedCertificate Issue(string name, string usage, string[] dnsNames, bool loopbackIp, string? keyPassword)
    {
        using var key = ECDsa.Create(ECCurve.NamedCurves.nistP256);
        var request = new CertificateRequest($"CN={name}, O=Quillmoor Works", key, HashAlgorithmName.SHA256);
        request.CertificateExtensions.Add(new X509BasicConstraintsExtension(false, false, 0, true));
        request.CertificateExtensions.Add(new X509KeyUsageExtension(X509KeyUsageFlags.DigitalSignature, true));
        request.CertificateExtensions.Add(new X509EnhancedKeyUsageExtension([new Oid(usage)], false));
        if (dnsNames.Length > 0 || loopbackIp)
        {
            var san = new SubjectAlternativeNameBuilder();
            foreach (var dns in dnsNames) san.AddDnsName(dns);
            if (loopbackIp) san.AddIpAddress(IPAddress.Loopback);
            request.CertificateExtensions.Add(san.Build());
        }
        var now = TimeProvider.System.GetUtcNow();
        using var cert = request.Create(_ca, now.AddHours(-1), now.AddDays(1), BitConverter.GetBytes(++_serial));
        var certFile = Path.Combine(Dir, $"{Slug(name)}.pem");
        var keyFile = Path.Combine(Dir, $"{Slug(name)}.key");
        var keyPem = keyPassword is null
            ? key.ExportPkcs8PrivateKeyPem()
            : key.ExportEncryptedPkcs8PrivateKeyPem(keyPassword, new PbeParameters(PbeEncryptionAlgorithm.Aes256Cbc, HashAlgorithmName.SHA256, 10_000));
        File.WriteAllText(certFile, cert.ExportCertificatePem());
        File.WriteAllText(keyFile, keyPem);
        if (!OperatingSystem.IsWindows()) File.SetUnixFileMode(keyFile, (UnixFileMode)0b110_100_100);
        return new IssuedCertificate(certFile, keyFile, keyPem);
    }

    private static string Slug(string name) => new(name.Select(c => char.IsAsciiLetterOrDigit(c) ? char.ToLowerInvariant(c) : '-').ToArray());

    public void Dispose()
    {
        _ca.Dispose();
        _caKey.Dispose();
        try { Directory.Delete(Dir, true); } catch (IOException) { }
    }
}
