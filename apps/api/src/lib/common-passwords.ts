// Very common passwords of 8 characters or more (shorter ones fail the length rule anyway).
// Compiled by hand from the patterns that top every published leak analysis: keyboard walks,
// digit runs, "password" variants, common words with years. Compared in lower case.
const list = `
12345678 123456789 1234567890 12345678910 0123456789 87654321 987654321 11111111 00000000
22222222 66666666 88888888 99999999 12121212 11223344 13131313 12344321 123123123 147258369
password password1 password12 password123 password1234 password! passw0rd p@ssword p@ssw0rd
p@ssword1 passwort motdepasse contraseña wachtwoord qwertyui qwertyuiop qwerty123 qwerty1234
qwerty12 1qaz2wsx 1q2w3e4r 1q2w3e4r5t 1q2w3e4r5t6y zaq12wsx zaq1zaq1 asdfghjk asdfghjkl
asdf1234 zxcvbnm1 zxcvbnm123 qazwsxedc q1w2e3r4 q1w2e3r4t5 a1b2c3d4 abcd1234 abc12345
abcdefgh iloveyou iloveyou1 sunshine sunshine1 princess princess1 football football1
baseball baseball1 basketball superman batman123 starwars welcome1 welcome123 letmein1
letmein123 trustno1 whatever computer internet samsung1 michelle jennifer jessica1 charlie1
master123 dragon123 monkey123 shadow123 freedom1 mustang1 liverpool chelsea1 arsenal1
changeme changeme1 default1 administrator admin123 admin1234 root1234 secret123 test1234
testtest guest123 welcome! hello123 helloworld loveyou1 lovely123 flower123 summer2024
summer2025 summer2026 winter2024 winter2025 winter2026 spring2025 autumn2025 january1
mypassword yourpassword newpassword oldpassword nopassword temppassword password2024
password2025 password2026 qwerty2025 google123 facebook1 football123 1234qwer qwer1234
aa123456 aaaaaaaa asdasdasd zzzzzzzz qweqweqwe 123qweasd 123qweasdzxc 1qazxsw2 q1w2e3r4t5y6
iloveyou2 daniel123 michael1 robert123 thomas123 jordan23 anthony1 matthew1 joshua123
motorbike motorcycle classiccar mechanic1 garage123 workshop1 restoration tappet-demo tappet123
`;

/** Lower-cased set of passwords that are refused when a person chooses a password. */
export const commonPasswords: ReadonlySet<string> = new Set(list.split(/\s+/).filter(Boolean));
